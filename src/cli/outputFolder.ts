/**
 * Writing a set of files as one folder, all or nothing.
 *
 * `export` writes a dozen or several hundred files. Written one by one into
 * the target, a failure halfway (a name taken by a folder, a full disk)
 * leaves half an export that looks complete. Instead:
 *
 * 1. The target is checked first, before any work: it must be missing (its
 *    parent is then created), an empty folder, or a folder holding only
 *    files an earlier export wrote (`ours`); a file, a path under a file, a
 *    folder with other files, or a place the system refuses are reported.
 * 2. The files are written into a hidden temporary folder: beside a missing
 *    target, inside an existing one (the same file system either way, so the
 *    last step is a rename).
 * 3. Only when every file is written does the result move into place: a
 *    missing target by one rename of the whole folder; an existing one by
 *    moving the earlier export's entries aside, the new ones in, and then
 *    deleting the old ones (restored if a move fails). An existing folder
 *    keeps its own identity (its permissions, a shell's working directory).
 *
 * Any failure removes the temporary folder and leaves the target as it was.
 */
import { mkdir, mkdtemp, readdir, realpath, rename, rm, rmdir, stat, writeFile } from "node:fs/promises";
import { basename, dirname, join, resolve } from "node:path";
import { shownArg } from "./args.ts";

/** One file of the folder: its path inside it (`/`-separated, e.g. `spice/S0.cir`) and its contents. */
export interface OutputFile {
  readonly name: string;
  readonly data: string | Uint8Array;
}

/** Names an earlier export may hold: regular files matching `files`, folders matching `folders` (paths `/`-separated). */
export interface OwnNames {
  readonly files: readonly RegExp[];
  readonly folders: readonly RegExp[];
}

export type FolderOutcome = { readonly ok: true } | { readonly ok: false; readonly message: string };

/** Hidden names this module gives its temporary folders; an earlier run's leftovers are ours too. */
const TEMP_PREFIX = ".diodeloom-";

const REASONS: Readonly<Record<string, string>> = {
  EACCES: "permission denied",
  EPERM: "the system does not permit it",
  EROFS: "the file system is read-only",
  ENOSPC: "no space left on the device",
  EDQUOT: "the disk quota is used up",
  ENAMETOOLONG: "the path is too long",
  ELOOP: "the path has a loop of symbolic links",
  ENOTDIR: "a part of the path is a file, not a folder",
  EEXIST: "something else appeared there meanwhile",
  ENOTEMPTY: "something else appeared there meanwhile",
  EXDEV: "the temporary folder ended up on another file system",
};

function codeOf(e: unknown): string {
  return (e as NodeJS.ErrnoException).code ?? "";
}

function reasonOf(e: unknown): string {
  const code = codeOf(e);
  return REASONS[code] ?? (code !== "" ? `error ${code}` : String(e));
}

const failed = (message: string): FolderOutcome => ({ ok: false, message });

/** The entry's kind, or undefined when nothing is there. Throws for other errors (ENOTDIR, EACCES...). */
async function kindOf(path: string): Promise<"folder" | "file" | "other" | undefined> {
  try {
    const s = await stat(path);
    return s.isDirectory() ? "folder" : s.isFile() ? "file" : "other";
  } catch (e) {
    if (codeOf(e) === "ENOENT") return undefined;
    throw e;
  }
}

/** Every entry below `dir`, as `/`-separated relative paths with their kinds, folders before their contents. */
async function entriesBelow(dir: string, prefix = ""): Promise<{ name: string; folder: boolean }[]> {
  const out: { name: string; folder: boolean }[] = [];
  for (const d of await readdir(dir, { withFileTypes: true })) {
    const name = prefix === "" ? d.name : `${prefix}/${d.name}`;
    if (prefix === "" && d.name.startsWith(TEMP_PREFIX)) continue;
    out.push({ name, folder: d.isDirectory() });
    if (d.isDirectory()) out.push(...(await entriesBelow(join(dir, d.name), name)));
  }
  return out;
}

/** What is wrong with an existing folder as an export's target, or undefined when it may take one. */
async function foreignEntries(dir: string, ours: OwnNames): Promise<string | undefined> {
  const entries = await entriesBelow(dir);
  const foreign = entries.filter((e) => !(e.folder ? ours.folders : ours.files).some((re) => re.test(e.name)));
  if (foreign.length === 0) return undefined;
  const clash = foreign.find((e) => (e.folder ? ours.files : ours.folders).some((re) => re.test(e.name)));
  if (clash) {
    return `${shownArg(clash.name)} is a ${clash.folder ? "folder" : "file"} where the export writes a ${clash.folder ? "file" : "folder"}; remove or rename it, or give another folder`;
  }
  const shown = foreign
    .slice(0, 3)
    .map((e) => shownArg(e.name))
    .join(", ");
  return `the folder holds files diodeloom did not write (${shown}${foreign.length > 3 ? ", …" : ""}); give a new or empty folder, or the folder of an earlier export`;
}

/** The nearest existing ancestor of a missing path, or a message saying why the path cannot be a folder. */
async function existingAncestor(path: string): Promise<{ dir: string } | { message: string }> {
  let dir = dirname(path);
  for (;;) {
    let kind: Awaited<ReturnType<typeof kindOf>>;
    try {
      kind = await kindOf(dir);
    } catch (e) {
      // Under a file: keep climbing to find that file and name it.
      if (codeOf(e) !== "ENOTDIR") return { message: `cannot look at ${shownArg(dir, 200)} (${reasonOf(e)})` };
      kind = undefined;
    }
    if (kind === "folder") return { dir };
    if (kind !== undefined) return { message: `a part of the path is a file, not a folder (${shownArg(dir, 200)})` };
    const up = dirname(dir);
    if (up === dir) return { message: "no part of the path exists" };
    dir = up;
  }
}

/** Creates and removes a hidden folder in `dir`: the one sure test that new entries may be made there. */
async function probe(dir: string): Promise<string | undefined> {
  try {
    await rmdir(await mkdtemp(join(dir, TEMP_PREFIX)));
    return undefined;
  } catch (e) {
    return `the system refuses to create a folder in ${shownArg(dir, 200)} (${reasonOf(e)})`;
  }
}

type Target = { readonly path: string; readonly exists: boolean };

async function inspect(dir: string, ours: OwnNames): Promise<{ target: Target } | { message: string }> {
  const path = resolve(dir);
  let kind: Awaited<ReturnType<typeof kindOf>>;
  try {
    kind = await kindOf(path);
  } catch (e) {
    if (codeOf(e) === "ENOTDIR") {
      const up = await existingAncestor(path);
      return { message: "message" in up ? up.message : "a part of the path is a file, not a folder" };
    }
    return { message: `cannot use it (${reasonOf(e)})` };
  }
  if (kind === "file" || kind === "other")
    return { message: "is a file, not a folder; give the path of a folder (it is created if missing)" };
  if (kind === "folder") {
    const real = await realpath(path);
    try {
      const foreign = await foreignEntries(real, ours);
      if (foreign) return { message: foreign };
    } catch (e) {
      return { message: `cannot read the folder (${reasonOf(e)})` };
    }
    const refused = await probe(real);
    return refused ? { message: refused } : { target: { path: real, exists: true } };
  }
  const up = await existingAncestor(path);
  if ("message" in up) return up;
  const refused = await probe(up.dir);
  return refused ? { message: refused } : { target: { path, exists: false } };
}

/**
 * Checks that `dir` can take the export, before any work is done.
 *
 * @example
 * const r = await checkOutputFolder("out/lap-timer", EXPORT_NAMES);
 * if (!r.ok) console.error(`--out out/lap-timer: ${r.message}`);
 */
export async function checkOutputFolder(dir: string, ours: OwnNames): Promise<FolderOutcome> {
  const r = await inspect(dir, ours);
  return "message" in r ? failed(r.message) : { ok: true };
}

/** A file's maker failed while the files were written: a bug, passed on as it is (not a write failure). */
class MakerFailure {
  constructor(readonly cause: unknown) {}
}

/** Writes each file as it is made, so that only one is held at a time. */
async function writeAll(root: string, files: Iterable<OutputFile>): Promise<void> {
  const made = new Set<string>();
  const next = files[Symbol.iterator]();
  for (;;) {
    let step: IteratorResult<OutputFile>;
    try {
      step = next.next();
    } catch (e) {
      throw new MakerFailure(e);
    }
    if (step.done === true) return;
    const f = step.value;
    const parts = f.name.split("/");
    const folder = parts.slice(0, -1).join("/");
    if (folder !== "" && !made.has(folder)) {
      await mkdir(join(root, ...parts.slice(0, -1)), { recursive: true });
      made.add(folder);
    }
    await writeFile(join(root, ...parts), f.data);
  }
}

/** Creates the missing folders above `path`, one at a time (a recursive mkdir can spin on /proc). */
async function makeParents(path: string): Promise<void> {
  const missing: string[] = [];
  for (let dir = dirname(path); (await kindOf(dir)) === undefined; dir = dirname(dir)) missing.unshift(dir);
  for (const dir of missing) await mkdir(dir);
}

/**
 * Writes `files` as the folder `dir`, all or nothing (see the module note).
 * `ours` says which names an earlier export may hold there; they are
 * replaced, and anything else makes the write refuse. `files` may be a
 * generator: each file is written as it comes and then let go, so a big
 * export never holds all its files at once. An error thrown while a file
 * is made (a bug) removes the temporary folder and is thrown on.
 *
 * @example
 * await writeOutputFolder("out", [{ name: "bom.csv", data: text }], EXPORT_NAMES);
 */
export async function writeOutputFolder(dir: string, files: Iterable<OutputFile>, ours: OwnNames): Promise<FolderOutcome> {
  const inspected = await inspect(dir, ours);
  if ("message" in inspected) return failed(inspected.message);
  const { path, exists } = inspected.target;
  let temp: string | undefined;
  try {
    if (!exists) await makeParents(path);
    temp = await mkdtemp(exists ? join(path, TEMP_PREFIX) : join(dirname(path), `.${basename(path)}${TEMP_PREFIX}`));
    await writeAll(temp, files);
    if (!exists) {
      await rename(temp, path);
      temp = undefined;
      return { ok: true };
    }
    await swapEntries(path, temp);
    return { ok: true };
  } catch (e) {
    if (e instanceof MakerFailure) throw e.cause;
    return failed(`could not write the files (${reasonOf(e)}); nothing was changed there`);
  } finally {
    if (temp !== undefined) await rm(temp, { recursive: true, force: true }).catch(() => undefined);
  }
}

/**
 * Replaces the top-level entries of `target` (an earlier export, or
 * nothing) by those of `fresh` (a folder inside it): the old ones go into a
 * hidden backup folder, the new ones move up, the backup is deleted. If a
 * move fails, what was moved goes back.
 */
async function swapEntries(target: string, fresh: string): Promise<void> {
  const backup = await mkdtemp(join(target, TEMP_PREFIX));
  const old = (await readdir(target)).filter((n) => !n.startsWith(TEMP_PREFIX));
  const incoming = await readdir(fresh);
  const movedOut: string[] = [];
  const movedIn: string[] = [];
  try {
    for (const n of old) {
      await rename(join(target, n), join(backup, n));
      movedOut.push(n);
    }
    for (const n of incoming) {
      await rename(join(fresh, n), join(target, n));
      movedIn.push(n);
    }
  } catch (e) {
    for (const n of movedIn) await rename(join(target, n), join(fresh, n)).catch(() => undefined);
    for (const n of movedOut) await rename(join(backup, n), join(target, n)).catch(() => undefined);
    await rm(backup, { recursive: true, force: true }).catch(() => undefined);
    throw e;
  }
  await rm(backup, { recursive: true, force: true });
}
