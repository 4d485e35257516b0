/**
 * Coded-counter benchmark: the two-level minimum (diodes, gates, proof) and
 * its time for the reference cases of the specification and some bigger
 * counters, with the two-rank decoder beside it. Figures, not tests.
 *
 * Run alone: npx tsx -e 'import("./bench/codedBench.ts").then(m=>m.runCodedBench(console.log))'
 */
import { synthesizeCoded } from "../src/core/logic/synthesizeCoded.ts";
import { parseProject } from "../src/core/project/projectSchema.ts";
import { compileSpec } from "../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../src/core/synth/synthesize.ts";

interface CodedCase {
  readonly name: string;
  readonly code: "binary" | "johnson";
  readonly positions: number;
  readonly show: readonly string[];
  /** The specification's figure (diodes/gates), where it gives one. */
  readonly expected?: string;
}

const HEX = "0123456789AbCdEF";
const pad2 = (k: number): string => String(k).padStart(2, "0");

export const CODED_CASES: readonly CodedCase[] = [
  { name: "BCD 0-9", code: "binary", positions: 1, show: [..."0123456789"], expected: "40/7" },
  { name: "binary mod 16 0-F", code: "binary", positions: 1, show: [...HEX], expected: "83/16" },
  { name: "binary mod 6 0-5", code: "binary", positions: 1, show: [..."012345"], expected: "21/3" },
  { name: "Johnson 5 0-9", code: "johnson", positions: 1, show: [..."0123456789"], expected: "36/8" },
  { name: "Johnson 3 0-5", code: "johnson", positions: 1, show: [..."012345"], expected: "21/4" },
  { name: "Johnson 8 0-F", code: "johnson", positions: 1, show: [...HEX] },
  { name: "binary mod 12 1-12", code: "binary", positions: 2, show: Array.from({ length: 12 }, (_, k) => String(k + 1).padStart(2, " ")) },
  { name: "binary mod 60 00-59", code: "binary", positions: 2, show: Array.from({ length: 60 }, (_, k) => pad2(k)) },
  { name: "binary mod 100 00-99", code: "binary", positions: 2, show: Array.from({ length: 100 }, (_, k) => pad2(k)) },
];

function row(cells: readonly (string | number)[], widths: readonly number[]): string {
  return cells.map((c, i) => (i === 0 ? String(c).padEnd(widths[i] ?? 8) : String(c).padStart(widths[i] ?? 8))).join(" ");
}

export async function runCodedBench(log: (line: string) => void): Promise<void> {
  log("Coded counters: minimum two-level decoder (diodes/gates) and the two-rank decoder, project defaults (20 s limit)");
  const w = [22, 7, 9, 8, 7, 10, 8, 9, 12, 9, 9];
  log(row(["case", "stages", "2-level", "expected", "bound", "proof", "terms", "2L ms", "2-rank", "total ms", "chosen"], w));
  for (const c of CODED_CASES) {
    const parsed = parseProject(
      JSON.stringify({
        schema: "diodeloom/project@1",
        title: `bench ${c.name}`,
        counter: { states: c.show.length, code: c.code },
        display: { positions: c.positions },
        show: c.show,
      }),
    );
    if (!parsed.ok) throw new Error(`bench project ${c.name} is invalid: ${JSON.stringify(parsed.error)}`);
    const spec = compileSpec(parsed.value);
    const t0 = performance.now();
    let twoLevelMs = 0;
    const r = await synthesizeCoded(spec, synthSettings(parsed.value), {
      oneHot: synthesize,
      onProgress: (p) => {
        if (p.stage === "exact") twoLevelMs = performance.now() - t0;
      },
    });
    const total = performance.now() - t0;
    if (!r.ok) {
      log(row([c.name, "failed", r.error.message], w));
      continue;
    }
    const two = r.value.twoLevel;
    const rank = r.value.twoRank;
    const proof = two.matrix.optimal ? (two.gatesProven ? "proven" : "diodes") : two.end;
    log(
      row(
        [
          c.name,
          spec.counter.stages,
          `${two.matrix.count}/${two.gates}`,
          c.expected ?? "-",
          two.lowerBound,
          proof,
          two.terms,
          twoLevelMs.toFixed(0),
          `${rank.matrix.count}=${rank.gateDiodes}+${rank.matrixDiodes}`,
          total.toFixed(0),
          `${r.value.matrix.count} ${r.value.structure}`,
        ],
        w,
      ),
    );
  }
  log(
    "  2-level: diodes/gates of the two-level decoder; bound: proven lower bound on its diodes; proof: proven = diodes and gates proven least;",
  );
  log("  2-rank: one gate per state (gate diodes) + the ring-counter matrix on the state lines; chosen: what synth builds.");
}
