import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll } from "vitest";

/** Runs one deck's operating point in ngspice and returns the printed values by lower-case name. */
export type NgspiceOp = (deck: string, probes: readonly string[], file: string) => Map<string, number>;

/**
 * A runner of operating-point decks (`.op`, every value printed, then the
 * probes) in a temporary folder of its own, removed after the calling test
 * file; tight tolerances so the reference is the simulator's, not its
 * defaults'. Call it at the top level of a test file.
 */
export function ngspiceOpRunner(label: string): NgspiceOp {
  const dir = mkdtempSync(join(tmpdir(), `diodeloom-${label}-`));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  return (deck, probes, file) => {
    const control = [".options reltol=1e-6 vntol=1e-9 abstol=1e-15", ".control", "op", "print all", `print ${probes.join(" ")}`, ".endc"];
    const path = join(dir, file);
    writeFileSync(path, deck.replace(/^\.end$/m, [...control, ".end"].join("\n")));
    const out = execFileSync("ngspice", ["-b", path], { encoding: "utf8", stdio: ["ignore", "pipe", "pipe"] });
    const values = new Map<string, number>();
    for (const m of out.matchAll(/^\s*(\S+) = (\S+)\s*$/gm)) values.set((m[1] as string).toLowerCase(), Number(m[2]));
    return values;
  };
}
