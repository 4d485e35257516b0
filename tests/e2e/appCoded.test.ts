/**
 * The web app with a coded counter: choosing the code turns the demo into a
 * BCD counter, whose proven two-level decoder, gates, two-rank comparison
 * and power-up table the page shows.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { startApp, type AppHarness } from "./appBrowser.ts";

let app: AppHarness;
let context: BrowserContext;
let page: Page;

beforeAll(async () => {
  app = await startApp();
  context = await app.browser.newContext({ viewport: { width: 1280, height: 900 } });
  page = await context.newPage();
});

afterAll(async () => {
  await app?.close();
});

describe("the web app with a coded counter", () => {
  it("offers the counter code and shows the proven decoder, its gates, the two-rank decoder and the unused codes", async () => {
    await page.goto(app.url);
    await page.waitForSelector('[data-ready="yes"]', { timeout: 20_000 });
    expect(await page.getByTestId("decoder-panel").count()).toBe(0);
    // The demo counts 0-F; ten states in binary make it a BCD counter showing 0-9.
    await page.locator("#f-states").fill("10");
    await page.locator("#f-states").dispatchEvent("change");
    await page.getByTestId("counter-code").selectOption("binary");
    await page.waitForSelector('[data-testid="decoder-panel"]', { timeout: 20_000 });
    await expect.poll(() => page.getByTestId("exact-status").textContent(), { timeout: 60_000 }).toMatch(/proven minimum/);
    expect(await page.getByTestId("diode-count").getAttribute("data-count")).toBe("40");
    expect(await page.getByTestId("gate-count").textContent()).toBe("7");
    expect(await page.getByText("✓ verified").count()).toBe(1);
    const gates = await page.getByTestId("gate-list").locator("li").allTextContents();
    expect(gates.filter((g) => /^G\d+ = /.test(g))).toHaveLength(7);
    await expect.poll(() => page.getByTestId("two-rank-row").textContent(), { timeout: 60_000 }).toMatch(/two ranks\s*641010/);
    const codes = await page.getByTestId("power-up-list").locator("li").allTextContents();
    expect(codes.map((c) => c.slice(5, 9))).toEqual(["1010", "1011", "1100", "1101", "1110", "1111"]);
    // The drawing has the AND gates.
    // (SVG text keeps its spaces as no-break spaces.)
    expect(await page.getByTestId("matrix-drawing").textContent()).toMatch(/AND\sgates/);
    // The budget solves the decoder as built: a current-setting resistor per segment, the chart of every state.
    await expect.poll(() => page.getByTestId("emitter-table").locator("tr[data-testid^='emitter-R']").count(), { timeout: 60_000 }).toBe(7);
    expect(await page.getByTestId("budget-chart").count()).toBe(1);
  }, 120_000);
});
