/**
 * Harness for the web-app end-to-end test: a Vite dev server started in
 * process on a free port, and Debian's chromium driven by playwright-core.
 */
import { fileURLToPath } from "node:url";
import type { Browser } from "playwright-core";
import { launchChromium } from "../support/chromium.ts";
import { createServer, type ViteDevServer } from "vite";

const ROOT = fileURLToPath(new URL("../..", import.meta.url));

export interface AppHarness {
  readonly url: string;
  readonly browser: Browser;
  close(): Promise<void>;
}

/** Starts the dev server and the browser; fails loudly when chromium is missing. */
export async function startApp(): Promise<AppHarness> {
  const server: ViteDevServer = await createServer({
    root: ROOT,
    configFile: `${ROOT}vite.config.ts`,
    logLevel: "error",
    // Pre-bundle what the app and its worker import, so the first load does not stop to re-optimise and reload.
    optimizeDeps: { include: ["solid-js", "solid-js/web", "@svgdotjs/svg.js", "highs", "valibot"] },
    // No file watching and no hot reload: a file saved elsewhere during the run must not reload the page under test.
    server: { host: "127.0.0.1", port: 0, strictPort: false, hmr: false, watch: null },
  });
  await server.listen();
  const address = server.httpServer?.address();
  if (!address || typeof address === "string") throw new Error("the Vite server has no port");
  const url = `http://127.0.0.1:${address.port}/`;
  let browser: Browser;
  try {
    browser = await launchChromium();
  } catch (e) {
    await server.close();
    throw e;
  }
  return {
    url,
    browser,
    async close() {
      await browser.close();
      await server.close();
    },
  };
}
