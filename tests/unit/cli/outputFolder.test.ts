/**
 * Writing an export's folder all or nothing, on the real file system in a
 * temporary folder: the target is checked first, the files go into a hidden
 * temporary folder and move into place only when all are written.
 */
import { existsSync, readdirSync } from "node:fs";
import { mkdir, mkdtemp, readdir, readFile, rm, stat, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { checkOutputFolder, writeOutputFolder, type OutputFile } from "../../../src/cli/outputFolder.ts";
import { EXPORT_NAMES } from "../../../src/cli/commands/export.ts";

const roots: string[] = [];
afterAll(async () => {
  for (const r of roots) await rm(r, { recursive: true, force: true });
});

async function scratch(): Promise<string> {
  const r = await mkdtemp(join(tmpdir(), "diodeloom-out-"));
  roots.push(r);
  return r;
}

/** Every path below `dir`, sorted, folders marked with a trailing slash. */
async function tree(dir: string, prefix = ""): Promise<string[]> {
  const out: string[] = [];
  for (const d of await readdir(dir, { withFileTypes: true })) {
    const name = `${prefix}${d.name}`;
    if (d.isDirectory()) out.push(`${name}/`, ...(await tree(join(dir, d.name), `${name}/`)));
    else out.push(name);
  }
  return out.sort();
}

const FILES: OutputFile[] = [
  { name: "matrix.svg", data: "<svg/>" },
  { name: "bom.csv", data: "qty\n" },
  { name: "spice/S0.cir", data: "* S0\n.end\n" },
  { name: "spice/S1.cir", data: "* S1\n.end\n" },
];

describe("writeOutputFolder", () => {
  it("creates a missing folder (and its parents) in one rename, leaving nothing beside it", async () => {
    const root = await scratch();
    const out = join(root, "a", "b", "export");
    expect(await writeOutputFolder(out, FILES, EXPORT_NAMES)).toEqual({ ok: true });
    expect(await tree(out)).toEqual(["bom.csv", "matrix.svg", "spice/", "spice/S0.cir", "spice/S1.cir"]);
    expect(await readFile(join(out, "spice", "S1.cir"), "utf8")).toBe("* S1\n.end\n");
    expect(await readdir(join(root, "a", "b"))).toEqual(["export"]);
  });

  it("writes a generator's files one at a time: each is made only when the one before it is on disk", async () => {
    const root = await scratch();
    const out = join(root, "export");
    /** Every file in the hidden temporary folder beside the target so far. */
    const onDisk = (): string[] => {
      const temp = readdirSync(root).find((n) => n.startsWith(".export.diodeloom-"));
      if (temp === undefined) return [];
      return readdirSync(join(root, temp), { recursive: true, withFileTypes: true })
        .filter((d) => d.isFile())
        .map((d) => join(d.parentPath, d.name).slice(join(root, temp).length + 1))
        .sort();
    };
    const seen: string[][] = [];
    const made = function* (): Generator<OutputFile> {
      for (const f of FILES) {
        seen.push(onDisk());
        yield f;
      }
    };
    expect(await writeOutputFolder(out, made(), EXPORT_NAMES)).toEqual({ ok: true });
    expect(seen).toEqual([[], ["matrix.svg"], ["bom.csv", "matrix.svg"], ["bom.csv", "matrix.svg", "spice/S0.cir"]]);
    expect(await tree(out)).toEqual(["bom.csv", "matrix.svg", "spice/", "spice/S0.cir", "spice/S1.cir"]);
  });

  it("passes on an error thrown while a file is made (a bug, not a write failure), leaving nothing behind", async () => {
    const root = await scratch();
    const out = join(root, "export");
    const bug = new Error("bug: no sheet 3");
    const made = function* (): Generator<OutputFile> {
      yield* FILES.slice(0, 2);
      throw bug;
    };
    await expect(writeOutputFolder(out, made(), EXPORT_NAMES)).rejects.toBe(bug);
    expect(await readdir(root)).toEqual([]);
  });

  it("fills an existing empty folder, keeping the folder itself", async () => {
    const out = await scratch();
    const before = (await stat(out)).ino;
    expect(await writeOutputFolder(out, FILES, EXPORT_NAMES)).toEqual({ ok: true });
    expect(await tree(out)).toEqual(["bom.csv", "matrix.svg", "spice/", "spice/S0.cir", "spice/S1.cir"]);
    expect((await stat(out)).ino).toBe(before);
  });

  it("replaces an earlier export whole: stale decks and sheets go", async () => {
    const out = await scratch();
    await mkdir(join(out, "spice"));
    for (const f of ["matrix-1.svg", "matrix-2.svg", "wiring.csv", "spice/S0.cir", "spice/S9.cir"]) await writeFile(join(out, f), "old");
    expect(await writeOutputFolder(out, FILES, EXPORT_NAMES)).toEqual({ ok: true });
    expect(await tree(out)).toEqual(["bom.csv", "matrix.svg", "spice/", "spice/S0.cir", "spice/S1.cir"]);
    expect(await readFile(join(out, "spice", "S0.cir"), "utf8")).toBe("* S0\n.end\n");
  });

  it("refuses a folder holding anything else, naming it, and changes nothing", async () => {
    const out = await scratch();
    await writeFile(join(out, "notes.txt"), "mine");
    await writeFile(join(out, "bom.csv"), "old");
    const r = await writeOutputFolder(out, FILES, EXPORT_NAMES);
    expect(r).toEqual({
      ok: false,
      message: "the folder holds files diodeloom did not write (notes.txt); give a new or empty folder, or the folder of an earlier export",
    });
    expect(await tree(out)).toEqual(["bom.csv", "notes.txt"]);
  });

  it("refuses a clash (a folder where a file goes) before writing anything", async () => {
    const out = await scratch();
    await mkdir(join(out, "bom.csv"));
    const r = await writeOutputFolder(out, FILES, EXPORT_NAMES);
    expect(r).toEqual({
      ok: false,
      message: "bom.csv is a folder where the export writes a file; remove or rename it, or give another folder",
    });
    expect(await tree(out)).toEqual(["bom.csv/"]);
  });

  it("refuses a file, and a path under a file", async () => {
    const root = await scratch();
    const file = join(root, "afile");
    await writeFile(file, "x");
    expect(await checkOutputFolder(file, EXPORT_NAMES)).toEqual({
      ok: false,
      message: "is a file, not a folder; give the path of a folder (it is created if missing)",
    });
    expect(await checkOutputFolder(join(file, "sub", "deeper"), EXPORT_NAMES)).toEqual({
      ok: false,
      message: `a part of the path is a file, not a folder (${file})`,
    });
    expect(await readdir(root)).toEqual(["afile"]);
  });

  it.runIf(existsSync("/proc/self") && existsSync("/sys/kernel"))("refuses folders the system will not create, at once", async () => {
    const started = Date.now();
    expect(await checkOutputFolder("/proc/x", EXPORT_NAMES)).toEqual({
      ok: false,
      message: "the system refuses to create a folder in /proc (error ENOENT)",
    });
    const sys = await writeOutputFolder("/sys/x", FILES, EXPORT_NAMES);
    expect(sys.ok).toBe(false);
    expect(!sys.ok && sys.message).toMatch(/^the system refuses to create a folder in \/sys \(/);
    expect(Date.now() - started).toBeLessThan(5000);
  });

  it("leaves a missing target missing, and an earlier export as it was, when a write fails halfway", async () => {
    const root = await scratch();
    const broken: OutputFile[] = [...FILES.slice(0, 3), { name: "spice/bad\u0000name.cir", data: "x" }];
    const fresh = join(root, "fresh");
    const r = await writeOutputFolder(fresh, broken, EXPORT_NAMES);
    expect(r.ok).toBe(false);
    expect(!r.ok && r.message).toMatch(/^could not write the files \(.*\); nothing was changed there$/);
    expect(await readdir(root)).toEqual([]);

    const earlier = join(root, "earlier");
    expect(await writeOutputFolder(earlier, FILES, EXPORT_NAMES)).toEqual({ ok: true });
    const again = await writeOutputFolder(earlier, [{ name: "bom.csv", data: "new" }, ...broken.slice(3)], EXPORT_NAMES);
    expect(again.ok).toBe(false);
    expect(await tree(earlier)).toEqual(["bom.csv", "matrix.svg", "spice/", "spice/S0.cir", "spice/S1.cir"]);
    expect(await readFile(join(earlier, "bom.csv"), "utf8")).toBe("qty\n");
  });
});
