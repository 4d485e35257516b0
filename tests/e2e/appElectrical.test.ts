/**
 * The Electrical panel in the real browser, on the app's starting project
 * (the hex monitor, a 5 V low-side switch): every field of the section is
 * there with its unit and the preset picker; an electrical edit works out
 * the budget again and never the synthesis (before, changing the supply
 * started a new synthesis run and could change the diode count); a preset
 * changes every value at once, and the high-voltage one brings the cautions
 * on screen and on the driver-stage sheet after the matrix sheets.
 */
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { ELECTRICAL_PRESETS } from "../../src/core/project/electricalPresets.ts";
import { ELECTRICAL_GROUPS } from "../../src/ui/state/electricalForm.ts";
import { startApp, type AppHarness } from "./appBrowser.ts";

let app: AppHarness;
let page: Page;
const consoleErrors: string[] = [];

beforeAll(async () => {
  app = await startApp();
  const context = await app.browser.newContext({ viewport: { width: 1400, height: 1000 }, acceptDownloads: true });
  page = await context.newPage();
  page.on("console", (m) => void (m.type() === "error" && consoleErrors.push(m.text())));
  page.on("pageerror", (e) => consoleErrors.push(e.message));
});

afterAll(async () => {
  await app?.close();
});

const synthRuns = () => page.getByTestId("synth-runs").getAttribute("data-runs").then(Number);
const count = () => page.getByTestId("diode-count").getAttribute("data-count").then(Number);
const budgetTarget = () => page.getByTestId("budget-summary").getAttribute("data-target-a").then(Number);

async function saved(): Promise<{ electrical: Record<string, unknown> & { segment: { targetA: number }; preset: string } }> {
  const [download] = await Promise.all([page.waitForEvent("download"), page.getByTestId("save").click()]);
  return JSON.parse(readFileSync(await download.path(), "utf8"));
}

/** Types a value into a field and commits it, as leaving the field does. */
async function enter(id: string, text: string): Promise<void> {
  const input = page.locator(`#${id}`);
  await input.fill(text);
  await input.press("Enter");
  await input.blur();
}

describe("the Electrical panel", () => {
  it("shows every electrical field, grouped, with its unit, and the preset picker on the starting project", async () => {
    await page.goto(app.url);
    await page.waitForSelector('[data-ready="yes"]', { timeout: 20_000 });
    // The exact run would change the matrix later; the test watches the synthesis runs alone.
    const toggle = page.getByTestId("exact-toggle");
    if (await toggle.isChecked()) await toggle.uncheck();
    await expect.poll(() => page.getByTestId("live-busy").count(), { timeout: 30_000 }).toBe(0);
    await expect.poll(budgetTarget, { timeout: 30_000 }).toBe(0.01);
    const panel = page.getByTestId("electrical-panel");
    expect(await panel.locator("#e-preset").inputValue()).toBe("bench-5v-switch");
    expect(await panel.locator("#e-kind").inputValue()).toBe("low-side-switch");
    // No caution at the starting project's 5 V.
    expect(await page.getByTestId("caution").count()).toBe(0);
    for (const d of await panel.locator("details").all()) await d.evaluate((el) => ((el as HTMLDetailsElement).open = true));
    for (const g of ELECTRICAL_GROUPS) {
      const group = panel.locator("details", { has: page.locator("summary", { hasText: g.title }) });
      for (const f of g.fields) {
        const row = group.locator(`#e-${f.path.replace(/\./g, "-")}`);
        expect(await row.count(), f.path).toBe(1);
        expect(await row.locator("xpath=following-sibling::span[@class='unit']").textContent(), f.path).toBe(f.unit);
      }
      for (const o of g.overrides ?? []) expect(await group.locator(`#e-${o.path.replace(/\./g, "-")}`).count(), o.path).toBe(1);
    }
    expect(await panel.locator("#e-segment-targetA").inputValue()).toBe("10");
    expect(await panel.locator("#e-supply-volts").inputValue()).toBe("5");
  });

  it("works out the budget again, not the matrix, when an electrical value changes", async () => {
    const runs = await synthRuns();
    const diodes = await count();
    const drawing = await page.getByTestId("matrix-drawing").evaluate((svg) => svg.outerHTML);
    await enter("e-segment-targetA", "12");
    await expect.poll(budgetTarget, { timeout: 30_000 }).toBe(0.012);
    // A supply inside its own range (4.75-5.25 V) keeps the project valid.
    await enter("e-supply-volts", "5.2");
    await expect.poll(() => page.getByTestId("budget").getAttribute("data-supply-v"), { timeout: 30_000 }).toBe("5.2");
    expect((await saved()).electrical.segment.targetA).toBe(0.012);
    expect(await synthRuns()).toBe(runs);
    expect(await count()).toBe(diodes);
    // The same matrix is drawn (its drawing may be laid out again for notes that name electrical values).
    await expect
      .poll(() => page.getByTestId("matrix-drawing").evaluate((svg) => svg.querySelectorAll("[data-ref]").length))
      .toBe((drawing.match(/data-ref=/g) ?? []).length);
    // A change the synthesis does read starts a run: the counter is live.
    await enter("f-title", "Relay computer, electrical test");
    await expect.poll(synthRuns, { timeout: 30_000 }).toBe(runs + 1);
  });

  it("takes a preset's values at once; the high-voltage one brings the cautions, also on the driver-stage sheet", async () => {
    const runs = await synthRuns();
    await page.locator("#e-preset").selectOption("string-hv-sink");
    await expect.poll(budgetTarget, { timeout: 30_000 }).toBe(ELECTRICAL_PRESETS["string-hv-sink"].segment.targetA);
    expect(await page.locator("#e-kind").inputValue()).toBe("current-sink");
    expect(await page.locator("#e-supply-volts").inputValue()).toBe("80");
    expect(await page.getByTestId("caution").textContent()).toMatch(/DANGER: hazardous voltage/);
    const sheet = page.getByTestId("driver-sheet");
    await expect.poll(() => sheet.count(), { timeout: 30_000 }).toBe(1);
    const text = await sheet.textContent();
    expect(text).toContain("DANGER:\u00a0HAZARDOUS\u00a0VOLTAGE");
    expect(text).toContain("+VSUP\u00a080\u00a0V");
    expect(text).toContain("Re");
    expect(await synthRuns()).toBe(runs);
    expect((await saved()).electrical.preset).toBe("string-hv-sink");
    // Back to a safe preset: the cautions go.
    await page.locator("#e-preset").selectOption("cathode-5v-follower");
    await expect.poll(() => page.getByTestId("caution").count(), { timeout: 30_000 }).toBe(0);
    await expect.poll(() => sheet.textContent(), { timeout: 30_000 }).toContain("+VSUP\u00a05\u00a0V");
    expect(await synthRuns()).toBe(runs);
    expect(consoleErrors).toEqual([]);
  });

  it("offers the high-side switch: on a sink-drive counter its lit cells go onto the nS lines, and the budget and the driver sheet follow", async () => {
    const runs = await synthRuns();
    expect(await page.locator("#e-kind option").allTextContents()).toContain("high-side PNP switch (common cathode, active-low lines)");
    await page.getByTestId("counter-drive").selectOption("sink");
    await page.locator("#e-preset").selectOption("bench-5v-high-side");
    expect(await page.locator("#e-kind").inputValue()).toBe("high-side-switch");
    // The driver kind decides which lines the lit cells sit on: a new synthesis run, not only a budget.
    await expect.poll(synthRuns, { timeout: 60_000 }).toBeGreaterThan(runs);
    await expect.poll(() => page.getByTestId("live-busy").count(), { timeout: 60_000 }).toBe(0);
    await expect.poll(() => page.getByTestId("problems").count(), { timeout: 30_000 }).toBe(0);
    await expect.poll(count, { timeout: 30_000 }).toBeGreaterThan(0);
    await expect.poll(budgetTarget, { timeout: 30_000 }).toBe(0.01);
    const sheet = page.getByTestId("driver-sheet");
    await expect.poll(() => sheet.textContent(), { timeout: 30_000 }).toContain("PNP\u00a0high-side\u00a0switch");
    expect(await sheet.textContent()).toContain("Rpu");
    // Every diode of the matrix drawing hangs from an active-low row.
    const rows = await page.getByTestId("matrix-drawing").textContent();
    expect(rows).toContain("nS0");
    expect((await saved()).electrical.preset).toBe("bench-5v-high-side");
    expect(consoleErrors).toEqual([]);
  });
});
