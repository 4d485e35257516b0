/**
 * The web app for a newcomer: the New menu (a new project or any shipped
 * example, the person's project kept under Recent), the undo history over a
 * reload, the title block, and help in place for the words the app uses.
 * Screenshots go to /tmp for a person to look at.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { HELP, HELP_ORDER, type HelpTerm } from "../../src/ui/helpText.ts";
import { EXAMPLES } from "../../src/ui/state/examples.ts";
import { startApp, type AppHarness } from "./appBrowser.ts";

let app: AppHarness;
let context: BrowserContext;
let page: Page;
const consoleErrors: string[] = [];

const title = (p: Page = page) => p.locator("#f-title").inputValue();

async function waitReady(p: Page = page): Promise<void> {
  await p.waitForSelector('[data-ready="yes"]', { timeout: 20_000 });
}

/** Runs an action that changes the project, and waits until the page shows the new result. */
async function afterResult(action: () => Promise<void>, p: Page = page): Promise<void> {
  const pass = () => p.getByTestId("live-ms").getAttribute("data-pass");
  const before = await pass();
  await action();
  await expect.poll(pass, { timeout: 20_000 }).not.toBe(before);
}

beforeAll(async () => {
  app = await startApp();
  context = await app.browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
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

describe("getting started in the web app", () => {
  it("opens every shipped example and a new project from the New menu, keeping the person's project under Recent", async () => {
    await expect.poll(() => title()).toMatch(/hex monitor/);
    await afterResult(() => page.locator("#f-title").fill("My bench clock"));
    await page.locator("#f-title").blur();
    await page.getByTestId("new-menu").click();
    const items = await page.locator('[aria-label="New project or example"] button').allTextContents();
    // A new project and every shipped example.
    expect(items).toHaveLength(EXAMPLES.length + 1);
    await page.screenshot({ path: "/tmp/diodeloom-examples-menu.png" });
    await afterResult(() => page.getByTestId("example-die-roller").click());
    await expect.poll(() => title()).toMatch(/^Die roller/);
    expect(await page.getByTestId("notice").textContent()).toMatch(/Die roller.*under Recent/);
    // The person's own project is one click away.
    await page.getByTestId("recent-menu").click();
    expect(await page.getByTestId("recent-0").textContent()).toMatch(/^My bench clock/);
    await page.getByTestId("recent-menu").click();
    for (const [id, expected] of [
      ["example-antenna-rotator", /^Antenna rotator/],
      ["example-turntable-position", /^Turntable position/],
      ["example-relay-hex-monitor", /hex monitor/],
      ["new-blank", /^New project$/],
    ] as const) {
      await page.getByTestId("new-menu").click();
      await afterResult(() => page.getByTestId(id).click());
      await expect.poll(() => title()).toMatch(expected);
    }
    expect(await page.getByTestId("state-text-9").inputValue()).toBe("9");
    // Undo steps back through what was opened, as it does after opening a file.
    await afterResult(() => page.getByTestId("undo").click());
    await expect.poll(() => title()).toMatch(/hex monitor/);
    await afterResult(() => page.getByTestId("redo").click());
    await expect.poll(() => title()).toBe("New project");
    // And every project the person left is under Recent, newest first, with theirs among them.
    await page.getByTestId("recent-menu").click();
    const recent = await page.locator('[aria-label="Recent projects"] button').allTextContents();
    expect(recent.some((r) => r.startsWith("My bench clock"))).toBe(true);
    expect(recent[0]).toMatch(/hex monitor/);
    await page.getByTestId("recent-menu").click();
  });

  it("keeps the undo history over a reload", async () => {
    await afterResult(() => page.locator("#f-title").fill("Reload test"));
    await page.locator("#f-title").blur();
    await afterResult(() => page.getByTestId("state-text-3").fill("8"));
    await page.getByTestId("state-text-3").blur();
    // Give the history its moment to be written, as a person's pause would.
    await page.waitForTimeout(400);
    await page.reload();
    await waitReady();
    expect(await title()).toBe("Reload test");
    expect(await page.getByTestId("state-text-3").inputValue()).toBe("8");
    expect(await page.getByTestId("undo").isEnabled()).toBe(true);
    await afterResult(() => page.getByTestId("undo").click());
    expect(await page.getByTestId("state-text-3").inputValue()).toBe("3");
    await afterResult(() => page.getByTestId("undo").click());
    expect(await title()).toBe("New project");
    // Redo is kept as well.
    await afterResult(() => page.getByTestId("redo").click());
    expect(await title()).toBe("Reload test");
    await page.waitForTimeout(400);
    await page.reload();
    await waitReady();
    expect(await page.getByTestId("redo").isEnabled()).toBe(true);
    expect(await page.getByTestId("undo").isEnabled()).toBe(true);
  });

  it("takes the title block's drawing number, revision, date and drawn by, refusing a bad date as the command line does", async () => {
    const markup = () => page.getByTestId("matrix-drawing").evaluate((svg) => svg.textContent ?? "");
    await page.getByTestId("title-block").locator("summary").click();
    expect(await page.getByTestId("title-drawingNumber").getAttribute("placeholder")).toMatch(/^DL-[0-9A-F]{8}$/);
    await page.getByTestId("title-drawingNumber").fill("LT-7");
    await page.getByTestId("title-revision").fill("C");
    await page.getByTestId("title-drawnBy").fill("R. Ortiz");
    await page.getByTestId("title-date").fill("2026-02-31");
    // The same check as `diodeloom export --date`: no such day, and the drawing keeps its default meanwhile.
    expect(await page.getByTestId("title-date-problem").textContent()).toMatch(/2026-02 has no day 31/);
    expect(await page.getByTestId("title-date").getAttribute("aria-invalid")).toBe("true");
    await expect.poll(markup, { timeout: 20_000 }).toMatch(/LT-7[^]*Rev\.C[^]*R\.\sOrtiz/);
    expect(await markup()).not.toMatch(/2026-02-31/);
    await page.getByTestId("title-date").fill("2026-03-01");
    expect(await page.getByTestId("title-date-problem").count()).toBe(0);
    await expect.poll(markup, { timeout: 20_000 }).toMatch(/Date\sof\sissue2026-03-01/);
    // Kept in the browser: a reload keeps the fields and the drawing.
    await page.reload();
    await waitReady();
    expect(await page.getByTestId("title-drawingNumber").inputValue()).toBe("LT-7");
    await expect.poll(markup, { timeout: 20_000 }).toMatch(/LT-7/);
    // An empty field gives the drawing its default back.
    await page.getByTestId("title-block").locator("summary").click();
    await page.getByTestId("title-drawingNumber").fill("");
    await expect.poll(markup, { timeout: 20_000 }).toMatch(/DL-[0-9A-F]{8}/);
  });

  it("explains every new word in place and on a help page, in the words of helpText.ts", async () => {
    await page.goto(app.url);
    await waitReady();
    await page.waitForSelector('[data-testid="spread-words"]', { timeout: 30_000 });
    const required: HelpTerm[] = ["depthLimit", "depthPolicy", "busNode", "link", "boundGap", "seed", "trim", "spread", "corners"];
    for (const term of required) expect(await page.getByTestId(`help-${term}`).count(), term).toBe(1);
    // A tooltip on pointing, and a line on clicking, with the same words.
    const depth = page.getByTestId("help-depthLimit");
    expect(await depth.getAttribute("title")).toBe(HELP.depthLimit.text);
    expect(await depth.getAttribute("aria-expanded")).toBe("false");
    const before = await page.locator("#f-depth").inputValue();
    await depth.click();
    expect(await depth.getAttribute("aria-expanded")).toBe("true");
    expect(await page.getByTestId("help-depthLimit-text").textContent()).toBe(`${HELP.depthLimit.term}: ${HELP.depthLimit.text}`);
    expect(await page.locator("#f-depth").inputValue()).toBe(before);
    await page.screenshot({ path: "/tmp/diodeloom-help-in-place.png" });
    await depth.press("Escape");
    expect(await page.getByTestId("help-depthLimit-text").count()).toBe(0);
    // Inside the bus nodes label: the question mark explains, the box keeps its tick.
    const buses = page.getByText("bus nodes").locator("input");
    const ticked = await buses.isChecked();
    await page.getByTestId("help-busNode").click();
    expect(await page.getByTestId("help-busNode-text").isVisible()).toBe(true);
    expect(await buses.isChecked()).toBe(ticked);
    await page.getByTestId("help-busNode").click();
    // The help page lists every word with the same sentence.
    await page.getByTestId("help-open").click();
    const dialog = page.getByTestId("help-page");
    expect(await dialog.isVisible()).toBe(true);
    for (const k of HELP_ORDER) {
      expect(await dialog.locator(`#glossary-${k}`).textContent()).toBe(HELP[k].term);
      expect(await dialog.locator(`#glossary-${k} + dd`).textContent()).toBe(HELP[k].text);
    }
    await page.screenshot({ path: "/tmp/diodeloom-help-page.png" });
    await page.keyboard.press("Escape");
    expect(await dialog.isVisible()).toBe(false);
  });

  it("logged no console errors", () => {
    expect(consoleErrors).toEqual([]);
  });
});
