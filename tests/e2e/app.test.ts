/**
 * The web app in a real browser: Vite dev server + Debian chromium.
 *
 * One browser context runs the cases in order, like a person would: load the
 * demo, edit, open a bad file, reload, undo and redo, export, print. The
 * counts the page shows are checked against the core run in Node on the
 * project the page saves, so the screen cannot drift from the pipeline.
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { compileSpec } from "../../src/core/spec/decodeSpec.ts";
import { parseProject } from "../../src/core/project/projectSchema.ts";
import { synthesize, synthSettings } from "../../src/core/synth/synthesize.ts";
import { formatOhms } from "../../src/render/units.ts";
import { encodeShareHash } from "../../src/ui/state/shareLink.ts";
import { exampleText } from "../support/projects.ts";
import { bomValues, budgetEmitters } from "../support/partValues.ts";
import { xmlProblem } from "../support/xmlCheck.ts";
import { storedZipEntries } from "../support/zipRead.ts";
import { startApp, type AppHarness } from "./appBrowser.ts";

const BIN = new URL("../../bin/diodeloom.mjs", import.meta.url).pathname;
const ROOT = new URL("../../", import.meta.url).pathname;

let app: AppHarness;
let context: BrowserContext;
let page: Page;
const consoleErrors: string[] = [];

function watch(p: Page): void {
  p.on("console", (m) => {
    if (m.type() === "error") consoleErrors.push(`${m.type()}: ${m.text()}`);
  });
  p.on("pageerror", (e) => consoleErrors.push(`pageerror: ${e.message}`));
}

async function shownCount(p: Page = page): Promise<number> {
  const text = (await p.getByTestId("diode-count").textContent()) ?? "";
  const m = /(\d+)/.exec(text);
  if (!m) throw new Error(`no count in "${text}"`);
  return Number(m[1]);
}

async function drawingMarkup(p: Page = page): Promise<string> {
  return p.getByTestId("matrix-drawing").evaluate((svg) => svg.outerHTML);
}

/** Saves the project through the Save button and returns the file's text. */
async function savedProject(p: Page = page): Promise<string> {
  const [download] = await Promise.all([p.waitForEvent("download"), p.getByTestId("save").click()]);
  return readFileSync(await download.path(), "utf8");
}

/** The heuristic count the core gives in Node for a project text. */
async function coreFastCount(text: string): Promise<number> {
  const r = parseProject(text);
  if (!r.ok) throw new Error(`the saved project does not parse: ${JSON.stringify(r.error)}`);
  const m = await synthesize(compileSpec(r.value), synthSettings(r.value, { mode: "fast" }));
  if (!m.ok) throw new Error(m.error.message);
  return m.value.count;
}

/** Runs an action that changes the project, and waits until the page shows the new result (the live pass advances). */
async function afterResult(action: () => Promise<void>, p: Page = page): Promise<void> {
  const pass = () => p.getByTestId("live-ms").getAttribute("data-pass");
  const before = await pass();
  await action();
  await expect.poll(pass).not.toBe(before);
}

async function waitReady(p: Page = page): Promise<void> {
  await p.waitForSelector('[data-ready="yes"]', { timeout: 20_000 });
}

async function exactOff(p: Page = page): Promise<void> {
  const box = p.getByTestId("exact-toggle");
  if (await box.isChecked()) await box.uncheck();
}

beforeAll(async () => {
  app = await startApp();
  context = await app.browser.newContext({ viewport: { width: 1280, height: 800 }, acceptDownloads: true });
  page = await context.newPage();
  watch(page);
});

afterAll(async () => {
  await app?.close();
});

describe("the web app", () => {
  it("loads the demo with a verified count and a drawing", async () => {
    await page.goto(app.url);
    await waitReady();
    await expect.poll(() => page.locator("#f-title").inputValue()).toMatch(/hex monitor/);
    await exactOff();
    const count = await shownCount();
    expect(count).toBe(await coreFastCount(await savedProject()));
    expect(await page.getByText("✓ verified").count()).toBe(1);
    expect(await page.getByTestId("matrix-drawing").evaluate((e) => e.tagName.toLowerCase())).toBe("svg");
    // The demo runs at a safe 5 V: no hazard caution.
    expect(await page.getByTestId("caution").count()).toBe(0);
  });

  it("changes one state's text: the count and the drawing change and still verify", async () => {
    const before = await shownCount();
    const drawing = await drawingMarkup();
    await page.getByTestId("state-text-1").fill("8");
    await expect.poll(() => shownCount()).not.toBe(before);
    // On a busy machine the direct matrix may show first; the heuristic's follows (then the live pass ends).
    await expect.poll(() => page.getByTestId("live-busy").count(), { timeout: 30_000 }).toBe(0);
    expect(await drawingMarkup()).not.toBe(drawing);
    expect(await page.getByText("✓ verified").count()).toBe(1);
    expect(await page.getByTestId("stale").count()).toBe(0);
    const saved = await savedProject();
    expect(JSON.parse(saved).show[1]).toBe("8");
    expect(await shownCount()).toBe(await coreFastCount(saved));
  });

  it("marks the result stale while the project is invalid", async () => {
    await page.getByTestId("state-text-2").fill("22");
    await expect.poll(() => page.getByTestId("stale").count()).toBe(1);
    // In the screen's words, not the file's path (show[2], display.positions).
    expect(await page.getByTestId("problems").textContent()).toContain(
      'State 2\'s text "22" has 2 characters; this display has 1 position',
    );
    expect(await page.getByTestId("problems").textContent()).not.toMatch(/show\[2\]|display\.positions/);
    await page.getByTestId("state-text-2").fill("2");
    await expect.poll(() => page.getByTestId("stale").count()).toBe(0);
  });

  it("toggles a glyph segment by pointer and by keyboard", async () => {
    await page.locator('.char-chip[data-char="7"]').click();
    const seg = page.locator('[data-testid="glyph-cell"] [data-segment="f"]');
    await expect.poll(() => seg.getAttribute("class")).toMatch(/seg-off/);
    await seg.click();
    await expect.poll(() => seg.getAttribute("class")).toMatch(/seg-on/);
    const saved = JSON.parse(await savedProject());
    // Saved in the one form every project file takes (the Project JSON export's): arrays of segment names.
    expect(saved.glyphs["7"]).toEqual(["a", "b", "c", "f"]);
    // On a busy machine the direct matrix may show before the heuristic's: wait for the count that stays.
    const expected = await coreFastCount(JSON.stringify(saved));
    await expect.poll(() => shownCount(), { timeout: 30_000 }).toBe(expected);
    // The same segment from the keyboard: focus it and press Space twice (off, then on again).
    const button = page.locator('[data-testid="glyph-cell"] .seg-button', { has: page.locator('[data-segment="f"]') });
    await button.focus();
    await page.keyboard.press("Space");
    await expect.poll(() => button.getAttribute("aria-checked")).toBe("false");
    await page.keyboard.press("Enter");
    await expect.poll(() => button.getAttribute("aria-checked")).toBe("true");
  });

  it("adds characters as it says, offers the built-in shape back only where there is one, and warns of look-alikes", async () => {
    const message = page.getByTestId("add-char-message");
    // A built-in character: opened for editing, with a message (before: nothing happened, nothing was said).
    await page.locator("#f-newchar").fill("P");
    await page.getByTestId("add-char").click();
    await expect.poll(() => message.textContent()).toBe('"P" has a built-in shape (abefg); it is open for editing');
    await expect.poll(() => page.locator('.char-chip[data-char="P"]').getAttribute("aria-pressed")).toBe("true");
    expect(await page.locator('[data-testid="glyph-cell"] [data-segment="e"]').getAttribute("class")).toMatch(/seg-on/);
    // A new one: opened unlit, and no glyph entry until it lights something (before: an entry that lit nothing).
    await page.locator("#f-newchar").fill("W");
    await page.getByTestId("add-char").click();
    await expect.poll(() => message.textContent()).toBe('"W" is new: click the segments it lights');
    expect(JSON.parse(await savedProject()).glyphs["W"]).toBeUndefined();
    expect(await page.getByTestId("back-to-builtin").count()).toBe(0);
    await page.locator('[data-testid="glyph-cell"] [data-segment="b"]').click();
    await expect.poll(async () => JSON.parse(await savedProject()).glyphs["W"]).toEqual(["b"]);
    // W has no built-in shape, so there is nothing to go back to.
    expect(await page.getByTestId("back-to-builtin").count()).toBe(0);
    await page.getByTestId("undo").click();
    // A 4 edited into the shape of a 9: the editor says the display cannot tell them apart.
    expect(await page.getByTestId("same-shape").count()).toBe(0);
    await page.locator('.char-chip[data-char="4"]').click();
    for (const seg of ["a", "d"]) await page.locator(`[data-testid="glyph-cell"] [data-segment="${seg}"]`).click();
    await expect.poll(() => page.getByTestId("same-shape").textContent()).toMatch(/“4” and “9” look the same \(a b c d f g\)/);
    await expect.poll(() => page.getByTestId("back-to-builtin").count()).toBe(1);
    await page.getByTestId("back-to-builtin").click();
    await expect.poll(() => page.getByTestId("same-shape").count()).toBe(0);
  });

  it("refuses an invalid file with path-naming errors and leaves the project unchanged", async () => {
    // The last edit's live pass ends first, so the count read here is the one that stays (on a busy machine the direct count shows first).
    await expect.poll(() => page.getByTestId("live-busy").count(), { timeout: 30_000 }).toBe(0);
    const before = await savedProject();
    const count = await shownCount();
    const bad = JSON.stringify({ schema: "diodeloom/project@1", counter: { states: 1 }, display: { positions: 9 }, show: ["0"] });
    await page.getByTestId("open-input").setInputFiles({ name: "broken.json", mimeType: "application/json", buffer: Buffer.from(bad) });
    const notice = page.getByTestId("notice");
    await expect.poll(() => notice.textContent()).toMatch(/broken\.json was not opened/);
    const text = (await notice.textContent()) ?? "";
    expect(text).toContain("broken.json: States (counter.states in the file): got 1; must be a whole number from 2 to 256");
    expect(text).toContain("broken.json: Positions (display.positions in the file): got 9; must be a whole number from 1 to 8");
    expect(await savedProject()).toBe(before);
    expect(await shownCount()).toBe(count);
    await page.getByTestId("open-input").setInputFiles({ name: "junk.json", mimeType: "application/json", buffer: Buffer.from("{ nope") });
    await expect.poll(() => notice.textContent()).toMatch(/junk\.json: not valid JSON/);
    expect(await savedProject()).toBe(before);
    // Read as the command line reads a file: bytes that are not UTF-8 are named, not turned into U+FFFD.
    const latin1 = Buffer.from(before.replace(/"title": "[^"]*"/, '"title": "Caf\u00e9"'), "latin1");
    await page.getByTestId("open-input").setInputFiles({ name: "latin1.json", mimeType: "application/json", buffer: latin1 });
    await expect
      .poll(() => notice.textContent())
      .toMatch(/latin1\.json: Title \(title in the file\): holds a byte that is not UTF-8 \(0xE9 at byte \d+/);
    // A leading byte-order mark is accepted, as on the command line: the same project opens.
    const marked = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(before)]);
    await page.getByTestId("open-input").setInputFiles({ name: "marked.json", mimeType: "application/json", buffer: marked });
    await expect.poll(() => notice.textContent()).toMatch(/Opened marked\.json/);
    expect(await savedProject()).toBe(before);
    await notice.getByRole("button", { name: "Dismiss message" }).click();
  });

  it("keeps the edits over a reload", async () => {
    const before = await savedProject();
    await page.reload();
    await waitReady();
    await exactOff();
    expect(await page.getByTestId("state-text-1").inputValue()).toBe("8");
    expect(await savedProject()).toBe(before);
  });

  it("falls back to the previous autosave when the newest entry is corrupt", async () => {
    await page.evaluate(() => localStorage.setItem("diodeloom.autosave.current", '{"format":"diodeloom/autosave@1","proj'));
    await page.reload();
    await waitReady();
    await exactOff();
    expect(await page.getByTestId("notice").textContent()).toMatch(/current autosave was skipped/);
    expect(await page.locator("#f-title").inputValue()).toMatch(/hex monitor/);
    expect(await page.getByTestId("state-text-1").inputValue()).toBe("8");
    await page.getByTestId("notice").getByRole("button", { name: "Dismiss message" }).click();
  });

  it("undoes and redoes with the keyboard, but leaves text fields their own undo", async () => {
    await page.getByTestId("state-text-3").fill("0");
    await page.getByTestId("state-text-3").blur();
    await page.locator("body").click({ position: { x: 5, y: 790 } });
    await page.keyboard.press("Control+z");
    await expect.poll(() => page.getByTestId("state-text-3").inputValue()).toBe("3");
    await page.keyboard.press("Control+Shift+z");
    await expect.poll(() => page.getByTestId("state-text-3").inputValue()).toBe("0");
    await page.keyboard.press("Control+z");
    await expect.poll(() => page.getByTestId("state-text-3").inputValue()).toBe("3");
    await page.keyboard.press("Control+y");
    await expect.poll(() => page.getByTestId("state-text-3").inputValue()).toBe("0");
    // The buttons do the same.
    await page.getByTestId("undo").click();
    await expect.poll(() => page.getByTestId("state-text-3").inputValue()).toBe("3");
    await page.getByTestId("redo").click();
    await expect.poll(() => page.getByTestId("state-text-3").inputValue()).toBe("0");
    // Inside a text field Ctrl+Z belongs to the field (the browser's own undo). Had the app taken
    // it, its history would have stepped back over the title edit, and the one Undo click after
    // would then also take back state 3's edit.
    const title = await page.locator("#f-title").inputValue();
    await page.locator("#f-title").focus();
    await page.keyboard.press("End");
    await page.keyboard.type("X");
    await expect.poll(() => page.locator("#f-title").inputValue()).toBe(`${title}X`);
    await page.keyboard.press("Control+z");
    await expect.poll(() => page.locator("#f-title").inputValue()).toBe(title);
    await page.locator("#f-title").blur();
    await page.getByTestId("undo").click();
    await expect.poll(() => page.locator("#f-title").inputValue()).toBe(title);
    expect(await page.getByTestId("state-text-3").inputValue()).toBe("0");
  });

  it("downloads every export", async () => {
    const saved = await savedProject();
    // The BOM, decks and driver sheets take their values from the budget: export once it is on screen.
    await page.getByTestId("budget-summary").waitFor({ timeout: 60_000 });
    const buttons = page.locator('[data-testid^="export-"]');
    const n = await buttons.count();
    expect(n).toBeGreaterThan(0);
    const names: string[] = [];
    for (let i = 0; i < n; i++) {
      const b = buttons.nth(i);
      const kind = (await b.getAttribute("data-testid")) ?? "";
      const downloads: Promise<void>[] = [];
      if (!(await b.isVisible())) await page.getByTestId("exports-menu").click();
      const onDownload = (d: import("playwright-core").Download) => {
        downloads.push(
          (async () => {
            const name = d.suggestedFilename();
            const bytes = readFileSync(await d.path());
            const text = bytes.toString("utf8");
            names.push(name);
            expect(bytes.length, `${kind}: ${name} is empty`).toBeGreaterThan(0);
            if (name.endsWith(".json")) expect(() => JSON.parse(text)).not.toThrow();
            // Save and the Project JSON export write the same file, in one form.
            if (kind === "export-project") expect(text).toBe(saved);
            if (name.endsWith(".svg")) {
              expect(text).toMatch(/<svg[\s>]/);
              // The web app's SVG is XML that XML tools read (no HTML entities such as &nbsp;).
              expect(xmlProblem(text), name).toBeNull();
            }
            if (name.endsWith(".csv")) expect(text.split("\n").length).toBeGreaterThan(1);
            if (name.endsWith(".html")) expect(text).toMatch(/<table/);
            if (name.endsWith(".zip")) {
              expect(bytes.readUInt32LE(0)).toBe(0x04034b50);
              if (kind === "export-netlists") expect(text.match(/\.end\b/g)?.length).toBe(16);
              if (kind === "export-svg") {
                expect(text.match(/<svg[\s>]/g)?.length).toBeGreaterThan(1);
                for (const e of storedZipEntries(bytes)) expect(xmlProblem(e.text), e.name).toBeNull();
              }
            }
          })(),
        );
      };
      page.on("download", onDownload);
      await b.click();
      await page.waitForTimeout(kind === "export-budget" ? 1500 : 600);
      page.off("download", onDownload);
      await Promise.all(downloads);
      expect(downloads.length, `${kind} downloaded nothing`).toBeGreaterThan(0);
    }
    console.log(`exports downloaded: ${names.join(", ")}`);
  });

  it("shows one value per resistor, the same as the command line's, with the trim as set in the Budget panel", async () => {
    const work = mkdtempSync(join(tmpdir(), "diodeloom-app-design-"));
    try {
      const file = join(work, "project.json");
      writeFileSync(file, await savedProject());
      for (const [mode, args] of [
        ["on", ["--trim", "on"]],
        ["auto", []],
      ] as const) {
        await page.getByTestId("trim-mode").selectOption(mode);
        await expect.poll(() => page.getByTestId("budget").locator(".chip.stale").count(), { timeout: 20_000 }).toBe(0);
        const cli = JSON.parse(
          execFileSync(process.execPath, [BIN, "budget", file, "--json", "--fast", ...args], { cwd: ROOT, encoding: "utf8" }),
        ) as Parameters<typeof budgetEmitters>[0];
        const emitters = budgetEmitters(cli);
        expect(emitters.size).toBeGreaterThan(0);
        for (const [ref, ohms] of emitters) {
          const cell = page.locator(`[data-testid="emitter-${ref}"] [data-testid="emitter-value"]`);
          await expect.poll(() => cell.textContent(), { timeout: 20_000 }).toBe(formatOhms(ohms));
        }
        if (!(await page.getByTestId("export-bom").isVisible())) await page.getByTestId("exports-menu").click();
        const [download] = await Promise.all([page.waitForEvent("download"), page.getByTestId("export-bom").click()]);
        const bom = bomValues(readFileSync(await download.path(), "utf8"));
        for (const [ref, ohms] of emitters) expect([ref, bom.get(ref)]).toEqual([ref, formatOhms(ohms)]);
      }
    } finally {
      rmSync(work, { recursive: true, force: true });
    }
  });

  it("prints to PDF with the drawing on the page", async () => {
    await page.emulateMedia({ media: "print" });
    const box = await page.getByTestId("matrix-drawing").boundingBox();
    expect(box && box.width > 100 && box.height > 100).toBe(true);
    expect(await page.locator(".toolbar").isVisible()).toBe(false);
    await page.emulateMedia({ media: "screen" });
    const pdf = await page.pdf({ preferCSSPageSize: true, printBackground: true });
    const text = pdf.toString("latin1");
    expect(text.startsWith("%PDF")).toBe(true);
    const pages = text.match(/\/Type\s*\/Page[^s]/g)?.length ?? 0;
    expect(pages).toBeGreaterThanOrEqual(1);
    // A4 is 297 x 210 mm, 842 x 595 points, turned the way the drawing's sheets are (the layout picks the
    // orientation that needs the fewest sheets).
    const box0 = /\/MediaBox\s*\[\s*0\s+0\s+([\d.]+)\s+([\d.]+)\s*\]/.exec(text);
    const landscape = (await page.getByTestId("matrix-drawing").getAttribute("viewBox")) === "0 0 297 210";
    expect([Math.round(Number(box0?.[1])), Math.round(Number(box0?.[2]))]).toEqual(landscape ? [842, 595] : [595, 842]);
  });

  it("shares the project through the link in the hash", async () => {
    await page.getByTestId("share").click();
    await expect.poll(() => page.evaluate(() => location.hash)).toMatch(/^#p=[A-Za-z0-9_-]+$/);
    const link = await page.evaluate(() => location.href);
    const other = await context.browser()!.newContext({ viewport: { width: 1280, height: 800 }, acceptDownloads: true });
    const p2 = await other.newPage();
    watch(p2);
    await p2.goto(link);
    await waitReady(p2);
    expect(await p2.getByTestId("state-text-1").inputValue()).toBe("8");
    await exactOff(p2);
    expect(await shownCount(p2)).toBe(await shownCount());
    // An edit drops the link from the address bar, so a reload shows the edit, not the shared copy.
    await p2.getByTestId("state-text-5").fill("8");
    await expect.poll(() => p2.evaluate(() => location.hash)).toBe("");
    await p2.reload();
    await waitReady(p2);
    expect(await p2.getByTestId("state-text-5").inputValue()).toBe("8");
    await other.close();
    await page.evaluate(() => history.replaceState(null, "", location.pathname));
  });

  it("runs the exact optimizer in a worker, with a cancel button", async () => {
    // A short limit keeps the run brief; the optimizer reports its bound when it stops.
    await page.locator("#f-limit").fill("3");
    await page.locator("#f-limit").press("Enter");
    await page.getByTestId("exact-toggle").check();
    await page.getByTestId("state-text-4").fill("9");
    const status = page.getByTestId("exact-status");
    await expect.poll(() => status.getAttribute("data-status"), { timeout: 20_000 }).toMatch(/running|done|failed/);
    const early = await status.getAttribute("data-status");
    expect(early === "failed" ? await status.textContent() : "ok").toBe("ok");
    if ((await status.getAttribute("data-status")) === "running") {
      await page.getByTestId("exact-cancel").click();
      await expect.poll(() => status.getAttribute("data-status")).toBe("cancelled");
      await status.getByRole("button", { name: "Run again" }).click();
    }
    await expect.poll(() => status.getAttribute("data-status"), { timeout: 40_000, interval: 250 }).toMatch(/done|failed/);
    expect((await status.getAttribute("data-status")) === "done" ? "done" : await status.textContent()).toBe("done");
    expect(await page.getByText("✓ verified").count()).toBe(1);
    await exactOff();
  });

  it("measures and prints each edit's time to a new verified result for N <= 24", async () => {
    const figures: string[] = [];
    for (const [n, pattern, positions] of [
      [10, "0-9", 1],
      [16, "0-F", 1],
      [24, "00-23", 2],
    ] as const) {
      await page.locator("#f-positions").fill(String(positions));
      await page.locator("#f-positions").press("Enter");
      await page.locator("#f-pattern").fill(pattern);
      await page.locator("#f-pattern").press("Enter");
      await expect.poll(() => page.locator(".state-list li").count()).toBe(n);
      const samples: number[] = [];
      const inApp: number[] = [];
      for (let i = 0; i < 8; i++) {
        const value = i % 2 === 0 ? (positions === 2 ? "88" : "8") : positions === 2 ? "01" : "1";
        // Time from the input event to the count in the DOM, inside the page.
        const ms = await page.evaluate(async (v) => {
          const input = document.querySelector('[data-testid="state-text-1"]') as HTMLInputElement;
          const pass = () => document.querySelector('[data-testid="live-ms"]')?.getAttribute("data-pass");
          const before = pass();
          const t0 = performance.now();
          input.value = v;
          input.dispatchEvent(new Event("input", { bubbles: true }));
          while (pass() === before) {
            if (performance.now() - t0 > 5000) return NaN;
            await new Promise((r) => setTimeout(r, 0));
          }
          return performance.now() - t0;
        }, value);
        expect(ms, `no result arrived after setting state 1 to "${value}"`).not.toBeNaN();
        samples.push(ms);
        inApp.push(Number(await page.getByTestId("live-ms").getAttribute("data-ms")));
      }
      samples.sort((a, b) => a - b);
      inApp.sort((a, b) => a - b);
      const median = samples[Math.floor(samples.length / 2)] ?? NaN;
      const worst = samples[samples.length - 1] ?? NaN;
      figures.push(
        `N=${n} (${pattern}): edit-to-result median ${median.toFixed(1)} ms, max ${worst.toFixed(1)} ms; in-app pipeline median ${(inApp[4] ?? NaN).toFixed(1)} ms`,
      );
      expect(await page.getByText("✓ verified").count()).toBe(1);
    }
    console.log(figures.join("\n"));
  });

  it("adopts a row of the glyph-style comparison", async () => {
    const table = page.getByTestId("comparison");
    const row = table.locator('tr:has(button[data-testid^="adopt-"])').first();
    await expect.poll(() => row.count(), { timeout: 20_000 }).toBe(1);
    const button = row.locator('button[data-testid^="adopt-"]');
    const rowCount = Number(await row.locator("td").nth(1).locator("strong").textContent());
    const glyphs = await row.locator(".glyph-pair").evaluateAll((els) => els.map((e) => e.getAttribute("title")));
    await button.click();
    await expect
      .poll(() => table.locator("tr.is-current .glyph-pair").evaluateAll((els) => els.map((e) => e.getAttribute("title"))), {
        timeout: 20_000,
      })
      .toEqual(glyphs);
    // The comparison and the live result use the same heuristic, so the counts agree.
    await expect.poll(() => shownCount(), { timeout: 30_000 }).toBe(rowCount);
    const saved = JSON.parse(await savedProject());
    for (const g of glyphs) {
      const [ch, lit] = (g ?? "").split(" = ");
      // An override, or none where the row's shape is the built-in one.
      expect([[...(lit ?? "")].join(","), undefined]).toContain(saved.glyphs[ch ?? ""]?.join(","));
    }
    // The results come from a worker: wait for the undone project's result before the next case points at the drawing.
    await afterResult(() => page.getByTestId("undo").click());
  });

  it("highlights the diode under the pointer and steps through diodes from the keyboard", async () => {
    const first = page.locator('[data-testid="matrix-drawing"] g[data-ref="D1"]');
    // In the middle of the window, clear of the sticky toolbar, whichever way the sheet is turned.
    await first.evaluate((e) => e.scrollIntoView({ block: "center", inline: "center" }));
    const box = await first.boundingBox();
    if (!box) throw new Error("D1 is not drawn");
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await expect.poll(() => page.getByTestId("diode-readout").textContent()).toMatch(/^D1 anode S0/);
    expect(await page.locator('[data-testid="matrix-drawing"] .hl-row').count()).toBeGreaterThan(0);
    expect(await page.locator('[data-testid="matrix-drawing"] .hl-col').count()).toBeGreaterThan(0);
    await page.mouse.move(2, 790);
    await page.locator(".drawing-scroll").focus();
    await page.keyboard.press("ArrowRight");
    await page.keyboard.press("ArrowRight");
    await expect.poll(() => page.getByTestId("diode-readout").textContent()).toMatch(/^D2 /);
    await page.keyboard.press("+");
    await expect.poll(() => page.locator(".zoom-readout").textContent()).toMatch(/150/);
    await page.keyboard.press("-");
  });

  it("prints on Letter paper when Letter is chosen", async () => {
    await page.locator("#f-paper").selectOption("letter");
    await expect.poll(() => page.getByTestId("matrix-drawing").getAttribute("viewBox")).toMatch(/^0 0 (279\.4 215\.9|215\.9 279\.4)$/);
    const pdf = (await page.pdf({ preferCSSPageSize: true })).toString("latin1");
    // Letter is 11 x 8.5 in, 792 x 612 points, turned the way the drawing's sheets are.
    const box = /\/MediaBox\s*\[\s*0\s+0\s+([\d.]+)\s+([\d.]+)\s*\]/.exec(pdf);
    const landscape = (await page.getByTestId("matrix-drawing").getAttribute("viewBox")) === "0 0 279.4 215.9";
    expect([Math.round(Number(box?.[1])), Math.round(Number(box?.[2]))]).toEqual(landscape ? [792, 612] : [612, 792]);
    await page.locator("#f-paper").selectOption("a4");
  });

  it("prints and exports on A3 paper when A3 is chosen", async () => {
    await page.locator("#f-paper").selectOption("a3");
    await expect.poll(() => page.getByTestId("matrix-drawing").getAttribute("viewBox")).toBe("0 0 420 297");
    const pdf = (await page.pdf({ preferCSSPageSize: true })).toString("latin1");
    // ISO 216 A3 is 297 x 420 mm, 842 x 1191 points; the hex monitor's one sheet is landscape.
    const box = /\/MediaBox\s*\[\s*0\s+0\s+([\d.]+)\s+([\d.]+)\s*\]/.exec(pdf);
    expect([Math.round(Number(box?.[1])), Math.round(Number(box?.[2]))]).toEqual([1191, 842]);
    if (!(await page.getByTestId("export-svg").isVisible())) await page.getByTestId("exports-menu").click();
    const [download] = await Promise.all([page.waitForEvent("download"), page.getByTestId("export-svg").click()]);
    expect(readFileSync(await download.path(), "utf8")).toContain('width="420mm" height="297mm"');
    await page.locator("#f-paper").selectOption("a4");
  });

  it("opens a valid file with a custom cell, and undo brings the previous project back", async () => {
    const before = await savedProject();
    const text = exampleText("die-roller");
    await page
      .getByTestId("open-input")
      .setInputFiles({ name: "die-roller.json", mimeType: "application/json", buffer: Buffer.from(text) });
    await expect.poll(() => page.locator("#f-title").inputValue()).toMatch(/Die roller/);
    await expect.poll(async () => shownCount()).toBe(await coreFastCount(text));
    const pads = await page
      .locator('[data-testid="glyph-cell"] [data-segment]')
      .evaluateAll((els) => els.map((e) => e.getAttribute("data-segment")));
    expect(pads).toEqual(["tl", "tr", "ml", "c", "mr", "bl", "br"]);
    // Drawn as the project's figure says: a die face, tl above and left of c, br below and right of it.
    const centre = (name: string) =>
      page
        .locator(`[data-testid="glyph-cell"] circle[data-segment="${name}"]`)
        .evaluate((e) => [Number(e.getAttribute("cx")), Number(e.getAttribute("cy"))]);
    const [tl, c, br] = [await centre("tl"), await centre("c"), await centre("br")];
    expect(tl[0]! < c[0]! && c[0]! < br[0]! && tl[1]! < c[1]! && c[1]! < br[1]!).toBe(true);
    expect(await centre("ml")).toEqual([tl[0], c[1]]);
    await page.getByTestId("undo").click();
    await expect.poll(() => savedProject()).toBe(before);
  });

  it("keeps the person's project and the last good copy over reloads and a share link", async () => {
    const own = await app.browser.newContext({ viewport: { width: 1280, height: 800 }, acceptDownloads: true });
    const p = await own.newPage();
    watch(p);
    const slot = (key: string) =>
      p.evaluate((k) => {
        const text = localStorage.getItem(k);
        return text === null ? null : (JSON.parse(text) as { project: { title: string; show: string[] } }).project;
      }, key);
    await p.goto(app.url);
    await waitReady(p);
    await exactOff(p);
    // Two edits: the title (copy A), then state 1 (copy B, the newest).
    await p.locator("#f-title").fill("Workshop clock");
    await expect.poll(async () => (await slot("diodeloom.autosave.current"))?.title).toBe("Workshop clock");
    await p.getByTestId("state-text-1").fill("8");
    await expect.poll(async () => (await slot("diodeloom.autosave.current"))?.show[1]).toBe("8");
    for (let reload = 0; reload < 4; reload++) {
      await p.reload();
      await waitReady(p);
      expect(await p.getByTestId("state-text-1").inputValue()).toBe("8");
    }
    // The last good copy is still A, not a second copy of B.
    const lastGood = await slot("diodeloom.autosave.previous");
    expect(lastGood?.title).toBe("Workshop clock");
    expect(lastGood?.show[1]).not.toBe("8");
    // A share link to another project, opened and reloaded twice.
    await p.goto(app.url + (await encodeShareHash(exampleText("die-roller"))));
    await waitReady(p);
    await p.reload();
    await waitReady(p);
    await p.reload();
    await waitReady(p);
    expect(await p.locator("#f-title").inputValue()).toMatch(/Die roller/);
    // The person's project is the last good copy, and in Recent projects, which opens it again.
    expect((await slot("diodeloom.autosave.previous"))?.title).toBe("Workshop clock");
    expect((await slot("diodeloom.autosave.current"))?.title).toMatch(/Die roller/);
    await p.getByTestId("recent-menu").click();
    expect(await p.getByTestId("recent-0").textContent()).toMatch(/^Workshop clock/);
    await p.getByTestId("recent-0").click();
    await expect.poll(() => p.locator("#f-title").inputValue()).toBe("Workshop clock");
    expect(await p.getByTestId("state-text-1").inputValue()).toBe("8");
    // The shared project took its place in the list, so nothing was lost either way.
    await p.getByTestId("recent-menu").click();
    expect(await p.getByTestId("recent-0").textContent()).toMatch(/^Die roller/);
    await own.close();
  });

  it("shows the same notice for a bad link reached by a hash change as at load, and keeps the project", async () => {
    const before = await savedProject();
    await page.evaluate(() => (location.hash = "#p=AAAA$$"));
    const notice = page.getByTestId("notice");
    await expect.poll(() => notice.textContent()).toMatch(/The share link could not be read/);
    expect(await notice.textContent()).toMatch(/damaged \(not base64url\).*The project on screen is unchanged/s);
    expect(await savedProject()).toBe(before);
    await notice.getByRole("button", { name: "Dismiss message" }).click();
    await page.evaluate(() => history.replaceState(null, "", location.pathname));
  });

  it("says so the moment a save fails, offers the project as a download, and clears the mark once saving works again", async () => {
    const full = await app.browser.newContext({ viewport: { width: 1280, height: 800 }, acceptDownloads: true });
    const p = await full.newPage();
    watch(p);
    await p.goto(app.url);
    await waitReady(p);
    await exactOff(p);
    expect(await p.getByTestId("save-problem").count()).toBe(0);
    // From now on the browser's storage is full.
    await p.evaluate(() => {
      const real = Storage.prototype.setItem;
      (window as unknown as { realSetItem: typeof real }).realSetItem = real;
      Storage.prototype.setItem = () => {
        throw new DOMException("The quota has been exceeded.", "QuotaExceededError");
      };
    });
    await p.getByTestId("state-text-2").fill("8");
    const notice = p.getByTestId("notice");
    await expect.poll(() => notice.textContent()).toMatch(/Your edits are not being saved in this browser/);
    expect(await notice.textContent()).toMatch(/storage for this page is full/);
    expect(await p.getByTestId("save-problem").count()).toBe(1);
    const [download] = await Promise.all([p.waitForEvent("download"), p.getByTestId("notice-action").click()]);
    const rescued = JSON.parse(readFileSync(await download.path(), "utf8"));
    expect(rescued.show[2]).toBe("8");
    // Storage works again: the next save clears the mark and the notice.
    await p.evaluate(() => {
      Storage.prototype.setItem = (window as unknown as { realSetItem: typeof Storage.prototype.setItem }).realSetItem;
    });
    await p.getByTestId("state-text-3").fill("8");
    await expect.poll(() => p.getByTestId("save-problem").count()).toBe(0);
    expect(await p.getByTestId("notice").count()).toBe(0);
    await full.close();
  });

  it("starts, and says saving is refused, where the browser denies storage altogether", async () => {
    const denied = await app.browser.newContext({ viewport: { width: 1280, height: 800 } });
    await denied.addInitScript(() => {
      Object.defineProperty(window, "localStorage", {
        get() {
          throw new DOMException("Access is denied for this document.", "SecurityError");
        },
      });
    });
    const p = await denied.newPage();
    watch(p);
    await p.goto(app.url);
    await waitReady(p);
    await expect.poll(() => p.getByTestId("notice").textContent()).toMatch(/does not let this page store data/);
    expect(await p.getByText("✓ verified").count()).toBe(1);
    await denied.close();
  });

  it("stays answering on the largest project (256 states on 8 positions): every solve runs in a worker with a deadline", async () => {
    const HEX = "0123456789AbCdEF";
    const show = Array.from({ length: 256 }, (_, k) =>
      Array.from({ length: 8 }, (_, j) => HEX[(k * (2 * j + 3) + 5 * j + (k >> j)) % 16]).join(""),
    );
    const text = JSON.stringify({
      schema: "diodeloom/project@1",
      title: "Departure board 256 x 8",
      counter: { states: 256 },
      display: { positions: 8, cell: "seg7" },
      show,
      synthesis: { timeLimitMs: 20_000 },
    });
    const big = await app.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const p = await big.newPage();
    watch(p);
    await p.goto(app.url);
    await waitReady(p);
    await exactOff(p);
    await p.getByTestId("open-input").setInputFiles({ name: "board.json", mimeType: "application/json", buffer: Buffer.from(text) });
    // The direct matrix shows while the heuristic still runs in the worker, and the page runs a
    // script meanwhile: on the main thread the heuristic would hold the page for minutes.
    await p.getByTestId("live-busy").waitFor({ timeout: 60_000 });
    expect(await p.evaluate(() => document.querySelector('[data-testid="live-busy"]') !== null)).toBe(true);
    await p.locator("#f-title").fill("Departure board");
    await expect.poll(() => p.locator("#f-title").inputValue()).toBe("Departure board");
    // The heuristic keeps its own work budget at every size, so the worker answers well inside the
    // 20 s limit with a verified matrix smaller than the direct one (before, it ran past the limit and
    // the page fell back to the direct matrix with a note).
    await expect.poll(() => p.getByTestId("live-busy").count(), { timeout: 40_000, interval: 500 }).toBe(0);
    expect(await p.getByTestId("live-note").count()).toBe(0);
    const r = parseProject(text);
    if (!r.ok) throw new Error("bad fixture");
    const direct = await synthesize(compileSpec(r.value), synthSettings(r.value, { mode: "direct" }));
    if (!direct.ok) throw new Error(direct.error.message);
    expect(await shownCount(p)).toBeLessThan(direct.value.count);
    expect(await p.getByText("✓ verified").count()).toBe(1);
    await big.close();
  });

  it("looks right at 1280x800 and 390x844 (screenshots for a person to look at)", async () => {
    await page.setViewportSize({ width: 1280, height: 800 });
    await page.screenshot({ path: "/tmp/diodeloom-app-1280x800.png" });
    const phone = await context.browser()!.newContext({ viewport: { width: 390, height: 844 }, deviceScaleFactor: 1 });
    const p3 = await phone.newPage();
    watch(p3);
    await p3.goto(app.url);
    await waitReady(p3);
    await p3.screenshot({ path: "/tmp/diodeloom-app-390x844.png" });
    const overflow = await p3.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow, "the page scrolls sideways on a phone").toBeLessThanOrEqual(0);
    await phone.close();
  });

  it("logged no console errors", () => {
    expect(consoleErrors).toEqual([]);
  });
});
