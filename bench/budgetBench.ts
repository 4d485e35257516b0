/**
 * Budget benchmark: how long the DC solver takes for every state of the
 * 00-59 two-position project (target: under 200 ms in Node), and the whole
 * budget (nominal, lowest supply, trim and two corners) beside it; then the
 * largest project the format allows (256 states on 8 positions of a
 * 32-segment cell): one state's solve, split and direct, and its budget at
 * the default 20 s limit (the states that limit's work covers) against the
 * same limit. Speed targets live here, not in the tests.
 *
 * Run alone: npx tsx -e 'import("./bench/budgetBench.ts").then(m=>m.runBudgetBench(console.log))'
 */
import { solveBudget } from "../src/core/budget/budget.ts";
import { compileSpec } from "../src/core/spec/decodeSpec.ts";
import type { Project } from "../src/core/project/project.ts";
import { parseProject } from "../src/core/project/projectSchema.ts";
import { solveAllStates } from "../src/core/circuit/stateSweep.ts";
import { synthesize, synthSettings, type SynthMode } from "../src/core/synth/synthesize.ts";
import { circuitFrame, stateCircuit } from "../src/core/circuit/circuit.ts";
import { DcWorkspace, DEFAULT_DC_SETTINGS, solveDc } from "../src/core/circuit/dcSolver.ts";
import { largestCustomProject } from "../tests/support/largestProject.ts";

/** CPU milliseconds of `f` (user and system, this process). */
function cpuMs(f: () => void): number {
  const c0 = process.cpuUsage();
  f();
  const c = process.cpuUsage(c0);
  return (c.user + c.system) / 1000;
}

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

/** The largest project: one state's solve both ways, and the budget at its 20 s limit. */
export async function runLargestBudgetBench(log: (line: string) => void): Promise<void> {
  const project = largestCustomProject();
  const spec = compileSpec(project);
  const m = await synthesize(spec, synthSettings(project));
  if (!m.ok) {
    log(`largest: ${m.error.message}`);
    return;
  }
  log(`Budget of the largest project (256 x 8 of a 32-segment cell, ${m.value.count} diodes), CPU ms`);
  const frame = circuitFrame(spec, m.value, project.electrical);
  const widths = [8, 9, 10, 11, 11];
  log(row(["state", "Newton it", "split ms", "direct ms", "max dI A"], widths));
  const ws = new DcWorkspace();
  for (let k = 0; k < 3; k++) {
    const c = stateCircuit(frame, k);
    let split: ReturnType<typeof solveDc> | null = null;
    let direct: ReturnType<typeof solveDc> | null = null;
    const splitMs = cpuMs(() => (split = solveDc(c, c.guess, { ...DEFAULT_DC_SETTINGS, linear: "split" }, ws)));
    const directMs = cpuMs(() => (direct = solveDc(c, c.guess, { ...DEFAULT_DC_SETTINGS, linear: "direct" }, ws)));
    const a = split as ReturnType<typeof solveDc> | null;
    const b = direct as ReturnType<typeof solveDc> | null;
    if (!a?.ok || !b?.ok) {
      log(`S${k}: did not converge`);
      continue;
    }
    let worst = 0;
    for (const [el, i] of Object.entries(b.value.currents)) worst = Math.max(worst, Math.abs((a.value.currents[el] as number) - i));
    log(row([`S${k}`, a.value.iterations, splitMs.toFixed(0), directMs.toFixed(0), worst.toExponential(1)], widths));
  }
  const limitMs = project.synthesis.timeLimitMs;
  const t0 = performance.now();
  let checked = "";
  const ms = cpuMs(() => {
    const b = solveBudget(project, spec, m.value, { timeLimitMs: limitMs });
    checked = !b.ok
      ? b.error.message
      : b.value.coverage
        ? `${b.value.coverage.checked} of ${b.value.coverage.states} states`
        : "every state";
  });
  const wallMs = performance.now() - t0;
  log(
    `  budget at its ${limitMs / 1000} s limit: ${checked} checked, ${ms.toFixed(0)} CPU ms, ${wallMs.toFixed(0)} ms on the clock (${wallMs < limitMs ? "within" : "OVER"} the limit)`,
  );
}
