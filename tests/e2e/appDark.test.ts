/**
 * The web app with dark-decoded outputs: a counter with both line
 * polarities decoded in the cheaper polarity per output; the Budget panel
 * solves it and shows the pull-ups, the level-shift diodes and the ghost
 * check, which agree with the command line's budget of the same project.
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { startApp, type AppHarness } from "./appBrowser.ts";

const ROOT = fileURLToPath(new URL("../..", import.meta.url));
const BIN = join(ROOT, "bin", "diodeloom.mjs");
const dir = mkdtempSync(join(tmpdir(), "diodeloom-app-dark-"));

let app: AppHarness;
let context: BrowserContext;
let page: Page;

beforeAll(async () => {
  app = await startApp();
  context = await app.browser.newContext({ viewport: { width: 1280, height: 1400 } });
  page = await context.newPage();
});

afterAll(async () => {
  await app?.close();
  rmSync(dir, { recursive: true, force: true });
});

describe("the web app with dark-decoded outputs", () => {
  it("shows the dark decode's pull-ups and ghost check in the Budget panel, as the command line's budget has them", async () => {
    await page.goto(app.url);
    await page.waitForSelector('[data-ready="yes"]', { timeout: 20_000 });
    await page.locator("#f-states").fill("10");
    await page.locator("#f-states").dispatchEvent("change");
    await page.getByTestId("counter-drive").selectOption("complementary");
    await page.getByTestId("decode-polarity").selectOption("either");
    await expect.poll(() => page.getByTestId("exact-status").textContent(), { timeout: 90_000 }).toMatch(/proven minimum/);
    const panel = page.getByTestId("dark-budget");
    await panel.waitFor({ timeout: 90_000 });
    await expect.poll(() => page.getByTestId("budget").locator(".chip.stale").count(), { timeout: 60_000 }).toBe(0);
    expect(await panel.getAttribute("data-passes")).toBe("yes");
    const network = (await page.getByTestId("dark-network").textContent()) ?? "";
    expect(network).toMatch(/^pull-ups [\d.]+k from the logic supply, 2 level-shift diodes each/);
    const figures = await page.getByTestId("dark-figures").locator("li").allTextContents();
    expect(figures[0]).toMatch(
      /^worst unlit [\d.]+ µA \(1[a-g] in S\d, (nominal|low corner|high corner)\) against the 100\.0 µA ghost limit$/,
    );
    expect(figures[figures.length - 1]).toBe("every limit holds");
    // The outputs decoded lit hang from the active-high lines: the counter has lines that source current.
    expect(await page.getByTestId("counter-lines-note").count()).toBe(0);
    await page.screenshot({ path: "/work/shots/issue11-dark-budget.png", fullPage: true }).catch(() => undefined);

    // The same project through the command line: the same pull-up and the same worst unlit segment.
    const saved = () => page.evaluate(() => localStorage.getItem("diodeloom.autosave.current") ?? "");
    await expect.poll(saved, { timeout: 20_000 }).toMatch(/"decode": ?"either"/);
    const file = join(dir, "p.json");
    writeFileSync(file, JSON.stringify((JSON.parse(await saved()) as { project: unknown }).project));
    const cli = JSON.parse(execFileSync(process.execPath, [BIN, "budget", file, "--json"], { cwd: ROOT, encoding: "utf8" })) as {
      dark: { pullUpOhms: number; sizing: string; outputs: { output: string; pullUp: string }[] };
    };
    expect(network).toContain(`pull-ups ${cli.dark.pullUpOhms / 1000}k`);
    // The panel says which limit stops a smaller pull-up and the room left at every limit, as the budget does.
    expect(network).toContain(cli.dark.sizing);
    const text = execFileSync(process.execPath, [BIN, "budget", file], { cwd: ROOT, encoding: "utf8" });
    const margins = (await page.getByTestId("dark-margins").textContent()) ?? "";
    expect(margins).toMatch(/^margins: [\d.]+ % below the ghost limit, [\d.]+ % below the active-low line's rating, lit window/);
    expect(text).toContain(`  ${margins}\n`);
    // The result line names the outputs decoded dark, the budget's dark outputs.
    const dark = cli.dark.outputs.map((o) => o.output);
    expect(dark.length).toBeGreaterThan(0);
    expect(dark.length).toBeLessThan(7);
    expect(await page.getByTestId("dark-decode").textContent()).toMatch(new RegExp(`decoded dark: ${dark.join(" ")}\\)$`));
    // The drawing marks every output column lit or dark and hangs each dark column's pull-up from VLOGIC.
    const words = await page.locator(".drawing-scroll svg text").allTextContents();
    const plain = words.map((w) => w.replace(/\u00a0/g, " "));
    expect(plain.filter((w) => w === "dark")).toHaveLength(dark.length);
    expect(plain.filter((w) => w === "lit")).toHaveLength(7 - dark.length);
    expect(plain).toContain("VLOGIC");
    for (const o of cli.dark.outputs) expect(plain).toContain(o.pullUp);
    // Once the budget has sized them, the drawing prints the pull-ups' value beside each (the budget's, as export prints it).
    const value = `${cli.dark.pullUpOhms / 1000}k`;
    await expect
      .poll(async () => (await page.locator(".drawing-scroll svg text").allTextContents()).filter((w) => w === value).length, {
        timeout: 30_000,
      })
      .toBe(dark.length);
    // The print view's wiring list gives each pull-up the sheet and zone where the drawing has it, as export's wiring.csv does.
    const first = await page.getByTestId("print-network").locator("tr").first().locator("td").allTextContents();
    expect(first.slice(0, 2)).toEqual(["N1", cli.dark.outputs[0]?.pullUp]);
    expect(first.slice(3, 7)).toEqual(["VLOGIC", dark[0], "1", expect.stringMatching(/^[AB]\d$/)]);
    execFileSync(process.execPath, [BIN, "export", file, "--out", join(dir, "papers")], { cwd: ROOT, encoding: "utf8" });
    const csv = readFileSync(join(dir, "papers", "wiring.csv"), "utf8");
    expect(csv).toContain(`N1,${first[1]},VLOGIC,${dark[0]},1,${first[6]},`);
    await page
      .locator(".drawing-scroll")
      .first()
      .screenshot({ path: "/work/shots/issue11-app-dark-drawing.png" })
      .catch(() => undefined);
  }, 240_000);

  it("says once, as the command line does, that no active-high line is wired when every output is decoded dark, with no counter-sag note", async () => {
    // Continues from the project above: 10 states on complementary lines, now every output decoded dark.
    await page.getByTestId("decode-polarity").selectOption("dark");
    await expect.poll(() => page.getByTestId("exact-status").textContent(), { timeout: 90_000 }).toMatch(/proven minimum/);
    await page.getByTestId("dark-budget").waitFor({ timeout: 90_000 });
    await expect.poll(() => page.getByTestId("budget").locator(".chip.stale").count(), { timeout: 60_000 }).toBe(0);
    const note = page.getByTestId("counter-lines-note");
    await note.waitFor({ timeout: 30_000 });
    const said = (await note.textContent()) ?? "";
    expect(said).toBe(
      "Counter lines: none sources current (every output is decoded dark: the diodes meet only the active-low lines nS<k>; what each sinks is in the ghost check)",
    );
    const warnings = await page.getByRole("list", { name: "Budget warnings" }).locator("li").allTextContents();
    expect(warnings.some((w) => w.includes("sags"))).toBe(false);
    await page.screenshot({ path: "/work/shots/budgetfix-all-dark-counter-lines.png", fullPage: true }).catch(() => undefined);

    // The command line's budget of the same project prints the same sentence, once, and no line at 0 mA.
    const saved = () => page.evaluate(() => localStorage.getItem("diodeloom.autosave.current") ?? "");
    await expect.poll(saved, { timeout: 20_000 }).toMatch(/"decode": ?"dark"/);
    const file = join(dir, "all-dark.json");
    writeFileSync(file, JSON.stringify((JSON.parse(await saved()) as { project: unknown }).project));
    const text = execFileSync(process.execPath, [BIN, "budget", file], { cwd: ROOT, encoding: "utf8" });
    expect(text.split(said)).toHaveLength(2);
    expect(text).not.toMatch(/^ {2}S\d+ +0\.000 +5\.00 +0\.00$/m);
  }, 240_000);
});
