/**
 * The web app as `npm start` serves it: the production build (dist/web) on
 * the small static server of scripts/serveApp.mjs, started here exactly as a
 * user starts it, on a free port. The page, its two workers and HiGHS's
 * WebAssembly must all work from the built files.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { fileURLToPath } from "node:url";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchChromium } from "../support/chromium.ts";

const ROOT = fileURLToPath(new URL("../..", import.meta.url));

let server: ChildProcess | undefined;
let url = "";
let browser: Browser | undefined;
let page: Page;
const problems: string[] = [];
const requests: { url: string; type: string | undefined }[] = [];

/** Starts `npm start` in its own process group; resolves with the address it prints. */
function npmStart(): Promise<string> {
  return new Promise((resolve, reject) => {
    const child = spawn("npm", ["start"], {
      cwd: ROOT,
      env: { ...process.env, PORT: "0", HOST: "127.0.0.1" },
      detached: true,
      stdio: ["ignore", "pipe", "pipe"],
    });
    server = child;
    let output = "";
    const take = (chunk: Buffer) => {
      output += chunk.toString();
      const m = /diodeloom web app: (http:\/\/127\.0\.0\.1:\d+\/)/.exec(output);
      if (m) resolve(m[1] as string);
    };
    child.stdout?.on("data", take);
    child.stderr?.on("data", take);
    child.on("exit", (code) => reject(new Error(`npm start ended (exit ${code}) before it served:\n${output}`)));
  });
}

beforeAll(async () => {
  url = await npmStart();
  browser = await launchChromium();
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
  // On the context, so the workers' requests (HiGHS's WebAssembly) are seen too.
  context.on("response", (r) => requests.push({ url: r.url(), type: r.headers()["content-type"] }));
  page = await context.newPage();
  page.on("console", (m) => {
    if (m.type() === "error") problems.push(`console: ${m.text()}`);
  });
  page.on("pageerror", (e) => problems.push(`pageerror: ${e.message}`));
}, 180_000);

afterAll(async () => {
  await browser?.close();
  // npm runs the server as its child: end the whole group this test started.
  if (server?.pid !== undefined && server.exitCode === null) process.kill(-server.pid, "SIGTERM");
});

describe("npm start", () => {
  it("serves the built app on 127.0.0.1, not the sources", async () => {
    expect(url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/$/);
    const html = await (await fetch(url)).text();
    expect(html).toMatch(/<script type="module" crossorigin src="\/assets\/index-[\w-]+\.js">/);
    expect(html).not.toContain("/src/ui/main.tsx");
    expect((await fetch(`${url}package.json`)).status).toBe(404);
    expect((await fetch(`${url}%2e%2e/package.json`)).status).toBe(404);
  });

  it("loads the demo, solves its budget in the analysis worker and runs HiGHS in the exact worker", async () => {
    await page.goto(url);
    await page.waitForSelector('[data-ready="yes"]', { timeout: 30_000 });
    expect(await page.getByText("✓ verified").count()).toBe(1);
    await expect.poll(() => page.getByTestId("budget-chart").count(), { timeout: 30_000 }).toBeGreaterThan(0);
    // At depth 3 the per-state search does not apply, so the exact run loads HiGHS.
    await page.locator("#f-limit").fill("2");
    await page.locator("#f-limit").press("Enter");
    await page.locator("#f-depth").selectOption("3");
    const box = page.getByTestId("exact-toggle");
    if (!(await box.isChecked())) await box.check();
    const status = page.getByTestId("exact-status");
    await expect.poll(() => status.getAttribute("data-status"), { timeout: 60_000, interval: 250 }).toMatch(/done|failed/);
    expect((await status.getAttribute("data-status")) === "done" ? "done" : await status.textContent()).toBe("done");
    const wasm = requests.filter((r) => r.url.endsWith(".wasm"));
    expect(wasm.length).toBeGreaterThan(0);
    expect(wasm.every((r) => r.type === "application/wasm" && r.url.startsWith(`${url}assets/`))).toBe(true);
    expect(requests.every((r) => r.url.startsWith(url) || r.url.startsWith("blob:") || r.url.startsWith("data:"))).toBe(true);
  });

  it("logged no console errors", () => {
    expect(problems).toEqual([]);
  });
});
