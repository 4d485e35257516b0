/**
 * Budget benchmark: how long the DC solver takes for every state of the
 * 00-59 two-position project (target: under 200 ms in Node), and the whole
 * budget (nominal, lowest supply, trim and two corners) beside it.
 * Speed targets live here, not in the tests.
 *
 * Run alone: npx tsx -e 'import("./bench/budgetBench.ts").then(m=>m.runBudgetBench(console.log))'
 */
import { solveBudget } from "../src/core/budget/budget.ts";
import { compileSpec } from "../src/core/spec/decodeSpec.ts";
import type { Project } from "../src/core/project/project.ts";
import { parseProject } from "../src/core/project/projectSchema.ts";
import { solveAllStates } from "../src/core/circuit/stateSweep.ts";
import { synthesize, synthSettings, type SynthMode } from "../src/core/synth/synthesize.ts";

/** Target for solving every state of the 00-59 project, milliseconds. */
export const ALL_STATES_TARGET_MS = 200;

function clockProject(): Project {
  const show = Array.from({ length: 60 }, (_, k) => String(k).padStart(2, "0"));
  const r = parseProject(
    JSON.stringify({
      schema: "diodeloom/project@1",
      title: "bench 00-59",
      counter: { states: 60 },
      display: { positions: 2, cell: "seg7" },
      show,
    }),
  );
  if (!r.ok) throw new Error(`bench project is invalid: ${JSON.stringify(r.error)}`);
  return r.value;
}

function row(cells: readonly (string | number)[], widths: readonly number[]): string {
  return cells.map((c, i) => String(c).padStart(widths[i] ?? 8)).join(" ");
}

function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)] as number;
}

/** Prints the budget timings as a small table. */
export async function runBudgetBench(log: (line: string) => void): Promise<void> {
  const project = clockProject();
  const spec = compileSpec(project);
  const widths = [8, 7, 7, 9, 10, 10, 9, 11, 8];
  log(`Budget: all 60 states of 00-59 on two positions (target < ${ALL_STATES_TARGET_MS} ms); first run, then the median of 5`);
  log(row(["matrix", "diodes", "nodes", "Newton it", "first ms", "median ms", "target", "budget ms", "method"], widths));
  for (const mode of ["direct", "fast"] as SynthMode[]) {
    const m = await synthesize(spec, synthSettings(project, { mode }));
    if (!m.ok) {
      log(`${mode}: ${m.error.message}`);
      continue;
    }
    const times: number[] = [];
    let iterations = 0;
    let nodes = 0;
    let methods = "";
    for (let run = 0; run < 6; run++) {
      const t0 = performance.now();
      const r = solveAllStates(spec, m.value, project.electrical, "bench");
      times.push(performance.now() - t0);
      if (!r.ok) {
        log(`${mode}: ${r.error.message}`);
        return;
      }
      iterations = r.value.reduce((a, s) => a + s.op.iterations, 0);
      nodes = r.value[0]?.circuit.nodes.length ?? 0;
      methods = [...new Set(r.value.map((s) => s.op.method))].join("+");
    }
    const first = times[0] as number;
    const med = median(times.slice(1));
    const t0 = performance.now();
    const b = solveBudget(project, spec, m.value);
    const budgetMs = performance.now() - t0;
    if (!b.ok) log(`${mode}: ${b.error.message}`);
    log(
      row(
        [
          m.value.method,
          m.value.count,
          nodes,
          iterations,
          first.toFixed(1),
          med.toFixed(1),
          med < ALL_STATES_TARGET_MS ? "met" : "MISSED",
          budgetMs.toFixed(0),
          methods,
        ],
        widths,
      ),
    );
  }
}
