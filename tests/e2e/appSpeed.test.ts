/**
 * How long an edit takes to show its first figure in the real browser, at
 * sizes up to 100 states: the page shows a cheap verified answer (the direct
 * matrix) first and the heuristic's when it arrives, both from a worker, so
 * typing never waits. Measured and printed here; the target (under 200 ms
 * to the first figure) is a speed figure, so nothing here asserts a time.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { startApp, type AppHarness } from "./appBrowser.ts";

let app: AppHarness;
let page: Page;

beforeAll(async () => {
  app = await startApp();
  const context = await app.browser.newContext({ viewport: { width: 1280, height: 800 } });
  page = await context.newPage();
});

afterAll(async () => {
  await app?.close();
});

/** Sets state 1's text in the page and times the first figure and the final one, from the input event. */
async function timeEdit(value: string): Promise<{ first: number; final: number }> {
  return page.evaluate(async (v) => {
    const input = document.querySelector('[data-testid="state-text-1"]') as HTMLInputElement;
    const first = () => document.querySelector('[data-testid="first-ms"]')?.getAttribute("data-pass");
    const final = () => document.querySelector('[data-testid="live-ms"]')?.getAttribute("data-pass");
    const [first0, final0] = [first(), final()];
    const t0 = performance.now();
    input.value = v;
    input.dispatchEvent(new Event("input", { bubbles: true }));
    let firstAt = NaN;
    while (final() === final0) {
      if (Number.isNaN(firstAt) && first() !== first0) firstAt = performance.now() - t0;
      if (performance.now() - t0 > 30_000) return { first: firstAt, final: NaN };
      await new Promise((r) => setTimeout(r, 0));
    }
    if (Number.isNaN(firstAt)) firstAt = performance.now() - t0;
    return { first: firstAt, final: performance.now() - t0 };
  }, value);
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] ?? NaN;

describe("the first figure after an edit", () => {
  it("is measured and printed for 10 to 100 states", async () => {
    await page.goto(app.url);
    await page.waitForSelector('[data-ready="yes"]', { timeout: 20_000 });
    await page.getByTestId("exact-toggle").uncheck();
    const lines: string[] = [];
    for (const [n, pattern, positions] of [
      [10, "0-9", 1],
      [24, "00-23", 2],
      [60, "00-59", 2],
      [100, "00-99", 2],
    ] as const) {
      await page.locator("#f-positions").fill(String(positions));
      await page.locator("#f-positions").press("Enter");
      await page.locator("#f-pattern").fill(pattern);
      await page.locator("#f-pattern").press("Enter");
      await expect.poll(() => page.locator(".state-list li").count()).toBe(n);
      await expect.poll(() => page.getByTestId("live-busy").count(), { timeout: 30_000 }).toBe(0);
      const firsts: number[] = [];
      const finals: number[] = [];
      for (let i = 0; i < 8; i++) {
        const value = i % 2 === 0 ? "8".repeat(positions) : "1".padStart(positions, "0");
        const t = await timeEdit(value);
        expect(t.final, `no final result after setting state 1 to "${value}"`).not.toBeNaN();
        firsts.push(t.first);
        finals.push(t.final);
      }
      expect(await page.getByText("✓ verified").count()).toBe(1);
      lines.push(
        `N=${n} (${pattern}): first figure median ${median(firsts).toFixed(0)} ms, max ${Math.max(...firsts).toFixed(0)} ms; ` +
          `heuristic's figure median ${median(finals).toFixed(0)} ms, max ${Math.max(...finals).toFixed(0)} ms`,
      );
    }
    console.log(`edit to first figure (target under 200 ms up to 100 states):\n${lines.join("\n")}`);
  }, 240_000);
});
