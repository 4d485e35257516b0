// Types of serveApp.mjs, for the TypeScript that imports it (tests).
export declare const APP_DIR: string;
export declare function fileFor(dir: string, urlPath: string): string | null;
export declare function serveApp(options?: {
  dir?: string;
  host?: string;
  port?: number;
}): Promise<{ readonly url: string; close(): Promise<void> }>;
