/**
 * An instrument in the web app: a second decoder added to the demo in the
 * browser, renamed and edited, then found again after a reload (the
 * autosave and the undo history cover every decoder) and through a share
 * link. The summary's totals are checked against the core run in Node on
 * the instrument the page saves.
 */
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { designators } from "../../src/core/matrix/designators.ts";
import { countParts } from "../../src/core/papers/parts.ts";
import { parseInstrument } from "../../src/core/project/instrument.ts";
import { budgetDesign, solveBudget } from "../../src/core/budget/budget.ts";
import { instrumentBudget, type BudgetedDecoder } from "../../src/core/budget/instrumentBudget.ts";
import { compileSpec } from "../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../src/core/synth/synthesize.ts";
import { encodeShareHash } from "../../src/ui/state/shareLink.ts";
import { storedZipEntries } from "../support/zipRead.ts";
import { startApp, type AppHarness } from "./appBrowser.ts";

let app: AppHarness;
let context: BrowserContext;
let page: Page;
const consoleErrors: string[] = [];

async function waitReady(p: Page = page): Promise<void> {
  await p.waitForSelector('[data-ready="yes"]', { timeout: 30_000 });
}

/** Runs an action that changes the project, and waits until the page shows the new result. */
async function afterResult(action: () => Promise<void>, p: Page = page): Promise<void> {
  const pass = () => p.getByTestId("live-ms").getAttribute("data-pass");
  const before = await pass();
  await action();
  await expect.poll(pass, { timeout: 30_000 }).not.toBe(before);
}

/** Saves the project through the Save button and returns the file's text. */
async function savedProject(p: Page = page): Promise<string> {
  const [download] = await Promise.all([p.waitForEvent("download"), p.getByTestId("save").click()]);
  return readFileSync(await download.path(), "utf8");
}

interface Totals {
  readonly diodes: number;
  readonly transistors: number;
  readonly resistors: number;
  readonly segmentMa: number;
  readonly mw: number;
}

const decoderNames = (p: Page = page) => p.locator(".decoder-list .decoder-name").allTextContents();

/** The summary's totals once every decoder is worked out (no caveat left). */
async function shownTotals(p: Page = page): Promise<Totals> {
  await expect
    .poll(() => p.locator('[data-testid="instrument-summary"] tbody tr[data-status="done"]').count(), { timeout: 90_000 })
    .toBe(await p.locator('[data-testid="instrument-summary"] tbody tr').count());
  await expect.poll(() => p.getByTestId("summary-caveat").count(), { timeout: 60_000 }).toBe(0);
  const n = async (id: string) => Number((await p.getByTestId(id).textContent())?.replace(/,/g, ""));
  return {
    diodes: await n("total-diodes"),
    transistors: await n("total-transistors"),
    resistors: await n("total-resistors"),
    segmentMa: await n("total-segment-ma"),
    mw: await n("total-supply-mw"),
  };
}

/**
 * The same totals from the core in Node: each decoder's exact matrix,
 * budget and parts, summed, and the instrument budget's worst supply
 * current and power (as `diodeloom budget` gives them).
 */
async function coreTotals(text: string): Promise<Totals> {
  const r = parseInstrument(text);
  if (!r.ok) throw new Error(`the saved instrument does not parse: ${JSON.stringify(r.error)}`);
  const t = { diodes: 0, transistors: 0, resistors: 0 };
  const budgeted: BudgetedDecoder[] = [];
  for (const d of r.value.decoders) {
    const spec = compileSpec(d.project);
    const m = await synthesize(spec, synthSettings(d.project));
    if (!m.ok) throw new Error(m.error.message);
    const b = solveBudget(d.project, spec, m.value, { trim: "auto" });
    if (!b.ok) throw new Error(b.error.message);
    const groups = countParts(designators(spec, m.value, d.project.electrical, budgetDesign(b.value).ohms));
    for (const g of groups) {
      if (g.kind === "diode") t.diodes += g.refs.length;
      else if (g.kind === "transistor") t.transistors += g.refs.length;
      else if (g.kind !== "display") t.resistors += g.refs.length;
    }
    budgeted.push({ name: d.name, project: d.project, spec, matrix: m.value, budget: b.value });
  }
  const ib = instrumentBudget(r.value.title, budgeted);
  if (!ib.ok) throw new Error(ib.error.message);
  return { ...t, segmentMa: ib.value.segment.currentA.value * 1000, mw: ib.value.totalPowerW.value * 1000 };
}

beforeAll(async () => {
  app = await startApp();
  context = await app.browser.newContext({ viewport: { width: 1400, height: 1000 }, acceptDownloads: true });
  page = await context.newPage();
  page.on("console", (m) => {
    if (m.type() === "error") consoleErrors.push(m.text());
  });
  page.on("pageerror", (e) => consoleErrors.push(`pageerror: ${e.message}`));
  await page.goto(app.url);
  await waitReady();
  const box = page.getByTestId("exact-toggle");
  if (await box.isChecked()) await box.uncheck();
});

afterAll(async () => {
  await app?.close();
});

describe("an instrument in the web app", () => {
  it("adds a second decoder, renames and edits it, and keeps the first as it was", async () => {
    expect(await page.getByTestId("instrument-single").count()).toBe(1);
    const plain = JSON.parse(await savedProject());
    expect(plain.decoders).toBeUndefined();
    await afterResult(() => page.getByTestId("decoder-add").click());
    await expect.poll(() => page.getByTestId("instrument").getAttribute("data-decoders")).toBe("2");
    expect(await decoderNames()).toEqual(["main", "decoder 2"]);
    // The new decoder is open in the panels: the New project's 0-9.
    expect(await page.getByTestId("decoder-1").getAttribute("aria-pressed")).toBe("true");
    expect(await page.locator("#f-states").inputValue()).toBe("10");
    await page.getByTestId("decoder-name").fill("seconds");
    await page.getByTestId("decoder-name").press("Enter");
    await expect.poll(() => decoderNames()).toEqual(["main", "seconds"]);
    // Six states, 0-5: the tens of seconds.
    await afterResult(async () => {
      await page.locator("#f-states").fill("6");
      await page.locator("#f-states").press("Enter");
    });
    expect(await page.locator("#f-states").inputValue()).toBe("6");
    const saved = JSON.parse(await savedProject());
    expect(saved.decoders.map((d: { name: string; show: string[] }) => [d.name, d.show.join("")])).toEqual([
      ["main", plain.show.join("")],
      ["seconds", "012345"],
    ]);
    // The first decoder opens unchanged.
    await afterResult(() => page.getByTestId("decoder-0").click());
    expect(await page.locator("#f-states").inputValue()).toBe(String(plain.counter.states));
  });

  it("sums every decoder's parts and gives the instrument budget's worst supply, as the core does in Node", async () => {
    const shown = await shownTotals();
    const core = await coreTotals(await savedProject());
    expect(shown.diodes).toBe(core.diodes);
    expect(shown.transistors).toBe(core.transistors);
    expect(shown.resistors).toBe(core.resistors);
    // Shown to 0.01 mA and 1 mW.
    expect(Math.abs(shown.segmentMa - core.segmentMa)).toBeLessThanOrEqual(0.005);
    expect(Math.abs(shown.mw - core.mw)).toBeLessThanOrEqual(0.5);
    await page.getByTestId("instrument").screenshot({ path: "/tmp/diodeloom-instrument-e2e.png" });
  });

  it("exports one set of papers: one BOM of every decoder, designators numbered by decoder, and the sheet index", async () => {
    const shown = await shownTotals();
    const download = async (kind: string): Promise<{ name: string; bytes: Buffer }> => {
      await page.getByTestId("exports-menu").click();
      const [d] = await Promise.all([page.waitForEvent("download", { timeout: 120_000 }), page.getByTestId(`export-${kind}`).click()]);
      return { name: d.suggestedFilename(), bytes: readFileSync(await d.path()) };
    };
    const bom = await download("bom");
    expect(bom.name).toMatch(/-bom\.csv$/);
    const rows = bom.bytes.toString("utf8").trim().split("\n").slice(1);
    const quantity = (test: RegExp) => rows.filter((r) => test.test(r)).reduce((n, r) => n + Number(r.split(",")[0]), 0);
    expect(quantity(/matrix diode/)).toBe(shown.diodes);
    expect(quantity(/NPN/)).toBe(shown.transistors);
    expect(rows.find((r) => /matrix diode/.test(r))).toMatch(/1D1-1D\d+, 2D1-2D\d+/);
    const sheets = await download("svg");
    expect(sheets.name).toMatch(/-matrix-sheets\.zip$/);
    const names = storedZipEntries(sheets.bytes).map((e) => e.name);
    expect(names[0]).toBe("index.svg");
    expect(names).toContain("1-main/matrix.svg");
    expect(names).toContain("2-seconds/matrix.svg");
  });

  it("finds both decoders after a reload, with the undo history", async () => {
    await page.waitForTimeout(500);
    await page.reload();
    await waitReady();
    await expect.poll(() => decoderNames()).toEqual(["main", "seconds"]);
    await afterResult(() => page.getByTestId("decoder-1").click());
    expect(await page.locator("#f-states").inputValue()).toBe("6");
    // The history came back over the reload: undo steps back through the edits, to one decoder.
    for (let k = 0; k < 3; k++) await page.getByTestId("undo").click();
    await expect.poll(() => page.getByTestId("instrument").getAttribute("data-decoders")).toBe("1");
    for (let k = 0; k < 3; k++) await page.getByTestId("redo").click();
    await expect.poll(() => decoderNames()).toEqual(["main", "seconds"]);
  });

  it("carries every decoder in a share link", async () => {
    await page.getByTestId("share").click();
    await expect.poll(() => page.evaluate(() => location.hash)).toMatch(/^#p=/);
    const hash = await page.evaluate(() => location.hash);
    const other = await (await app.browser.newContext({ viewport: { width: 1400, height: 1000 } })).newPage();
    await other.goto(app.url + hash);
    await waitReady(other);
    await expect.poll(() => decoderNames(other)).toEqual(["main", "seconds"]);
    await other.close();
  });

  it("says beside the summary why a decoder on high-side switches draws nothing from the logic supply", async () => {
    // A quiz desk: the round on a sink-drive ring through PNP high-side switches, the team on NPN switches.
    const desk = {
      schema: "diodeloom/project@2",
      title: "Quiz desk",
      electrical: { preset: "bench-5v-switch" },
      decoders: [
        {
          name: "round",
          counter: { states: 10, drive: "sink" },
          display: { positions: 1 },
          show: [..."123456789F"],
          synthesis: { timeLimitMs: 5000 },
          electrical: { preset: "bench-5v-high-side" },
        },
        { name: "team", counter: { states: 4 }, display: { positions: 1 }, show: [..."1234"], synthesis: { timeLimitMs: 5000 } },
      ],
    };
    const other = await (await app.browser.newContext({ viewport: { width: 1400, height: 1000 } })).newPage();
    other.on("pageerror", (e) => consoleErrors.push(`pageerror: ${e.message}`));
    await other.goto(app.url + (await encodeShareHash(JSON.stringify(desk))));
    await waitReady(other);
    await expect.poll(() => decoderNames(other)).toEqual(["round", "team"]);
    await shownTotals(other);
    const logic = await other.locator('[data-testid="instrument-summary"] tbody tr td:nth-child(6)').allTextContents();
    expect(logic[0]).toBe("0.00");
    expect(Number(logic[1])).toBeGreaterThan(0);
    expect(await other.getByTestId("logic-note").allTextContents()).toEqual([
      "round: logic supply, nothing drawn: the high-side switches' active-low lines only sink current, the switches' base and pull-up currents from the segment supply.",
    ]);
    await other.getByTestId("instrument").screenshot({ path: "/work/shots/polish-logic-note.png" });
    await other.close();
  });

  it("logs no errors in the console", () => {
    expect(consoleErrors).toEqual([]);
  });
});
