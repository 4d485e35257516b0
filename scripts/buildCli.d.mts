// Types of buildCli.mjs, for the TypeScript that imports it (tests and bench).
export declare const CLI_DIR: string;
export declare const CLI_ENTRY: string;
export declare function buildCli(): Promise<number>;
