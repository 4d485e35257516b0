/**
 * The web app's figures agree: the result line and the comparison row in
 * use show the same count and status, an exact comparison shows its
 * progress row by row, its exact results survive adopting a row, and the
 * exact run's line says "proven minimum" only for a proven result. Driven
 * in the real browser on the hex-monitor demo.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { startApp, type AppHarness } from "./appBrowser.ts";

let app: AppHarness;
let page: Page;
const consoleErrors: string[] = [];

beforeAll(async () => {
  app = await startApp();
  const context = await app.browser.newContext({ viewport: { width: 1280, height: 900 } });
  page = await context.newPage();
  page.on("console", (m) => void (m.type() === "error" && consoleErrors.push(m.text())));
  page.on("pageerror", (e) => consoleErrors.push(e.message));
});

afterAll(async () => {
  await app?.close();
});

const header = () => page.getByTestId("diode-count").getAttribute("data-count").then(Number);
const inUse = () => page.locator('[data-testid="comparison"] tr.is-current');

async function inUseFigure(): Promise<{ count: number; status: string | null }> {
  const row = inUse();
  return {
    count: Number(await row.getByTestId("row-count").textContent()),
    status: await row.getByTestId("row-status").getAttribute("data-status"),
  };
}

describe("figures that agree", () => {
  it("shows the exact result in the result line and in the comparison's row in use alike", async () => {
    await page.goto(app.url);
    await page.waitForSelector('[data-ready="yes"]', { timeout: 20_000 });
    const status = page.getByTestId("exact-status");
    await expect.poll(() => status.getAttribute("data-status"), { timeout: 60_000, interval: 250 }).toBe("done");
    expect(await status.textContent()).toMatch(/^exact: proven minimum \d+/);
    await expect.poll(() => inUse().count(), { timeout: 20_000 }).toBe(1);
    // Before, the row in use kept its heuristic count beside the header's exact one.
    await expect.poll(inUseFigure, { timeout: 20_000 }).toEqual({ count: await header(), status: "proven" });
    expect(await page.getByTestId("comparison-caption").textContent()).not.toBe("heuristic counts");
  });

  it("runs the exact comparison row by row with its progress, and keeps its results across an adopt", async () => {
    const table = page.getByTestId("comparison");
    await table.getByRole("button", { name: "Exact" }).click();
    await expect.poll(() => page.getByTestId("comparison-progress").textContent(), { timeout: 20_000 }).toMatch(/exact: row \d+ of 8/);
    await expect.poll(() => page.getByTestId("comparison-progress").count(), { timeout: 120_000, interval: 500 }).toBe(0);
    const statuses = await table.getByTestId("row-status").evaluateAll((els) => els.map((e) => e.getAttribute("data-status")));
    expect(statuses).toHaveLength(8);
    expect(statuses.every((s) => s === "proven" || s === "best found")).toBe(true);
    expect(await page.getByTestId("comparison-caption").textContent()).not.toBe("heuristic counts");
    const counts = await table.getByTestId("row-count").evaluateAll((els) => els.map((e) => Number(e.textContent)));
    // Adopt the best row that is not in use; its exact figure is kept, and the result line takes it at once.
    const target = table.locator('tr:has(button[data-testid^="adopt-"])').first();
    const targetCount = Number(await target.getByTestId("row-count").textContent());
    const targetStatus = await target.getByTestId("row-status").getAttribute("data-status");
    const glyphs = await target.locator(".glyph-pair").evaluateAll((els) => els.map((e) => e.getAttribute("title")));
    await target.locator('button[data-testid^="adopt-"]').click();
    await expect
      .poll(
        () =>
          inUse()
            .locator(".glyph-pair")
            .evaluateAll((els) => els.map((e) => e.getAttribute("title"))),
        { timeout: 20_000 },
      )
      .toEqual(glyphs);
    await expect.poll(inUseFigure, { timeout: 20_000 }).toEqual({ count: targetCount, status: targetStatus });
    await expect.poll(header, { timeout: 20_000 }).toBe(targetCount);
    const exactLine = page.getByTestId("exact-status");
    await expect.poll(() => exactLine.textContent(), { timeout: 20_000 }).toMatch(/from an earlier run on these glyphs/);
    // Every other row still shows its exact figure: nothing was thrown away.
    const after = await table.getByTestId("row-status").evaluateAll((els) => els.map((e) => e.getAttribute("data-status")));
    expect(after.every((s) => s === "proven" || s === "best found")).toBe(true);
    expect((await table.getByTestId("row-count").evaluateAll((els) => els.map((e) => Number(e.textContent)))).sort()).toEqual(
      [...counts].sort(),
    );
  });

  it("logged no console errors", () => {
    expect(consoleErrors).toEqual([]);
  });
});
