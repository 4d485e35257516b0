/**
 * How much room the dark-decoded outputs' sized network leaves, in words,
 * for `synth` and `budget`: the margin to each limit of the ghost check,
 * and, where the margin to the limit that stops a smaller value is thin
 * (the sizing could not leave more), what the next E24 values up would give
 * (solved, every state at both corners).
 */
import { checkWith, PULL_UP_ROOM, roomSteps } from "../core/budget/ghostCheck.ts";
import type { DarkNetworkValues } from "../core/matrix/designators.ts";
import type { VerifiedMatrix } from "../core/matrix/matrix.ts";
import type { Project } from "../core/project/project.ts";
import type { DecodeSpec } from "../core/spec/decodeSpec.ts";
import { darkMargins, darkMarginsText, darkWhere, type GhostFigures } from "../render/darkBudgetText.ts";
import { formatOhms, microamps, milliamps } from "../render/units.ts";

/**
 * A margin under this share of its limit is called thin: the room the
 * sizing gives a pull-up where it can (ghostCheck.ts `PULL_UP_ROOM`).
 */
export const THIN_MARGIN = PULL_UP_ROOM;

const pct = (share: number): string => `${(100 * share).toFixed(1)} %`;

/**
 * The margin lines: every limit's margin, then, where the network passes and
 * the limit a smaller value breaks (the ghost limit or the active-low line's
 * rating, whichever has less room) has less than `THIN_MARGIN` left, a line
 * saying so and what each next step up the E24 series gives (the pull-up,
 * and with a divider whose ghost limit is short its upper resistor).
 *
 * @param design the current-setting resistors of the design, ohms, by output (a trim)
 */
export function darkMarginLines(
  project: Project,
  spec: DecodeSpec,
  matrix: VerifiedMatrix,
  network: DarkNetworkValues,
  g: GhostFigures,
  design?: ReadonlyMap<string, number>,
): string[] {
  const m = darkMargins(g);
  const lines = [darkMarginsText(g)];
  if (!g.passes) return lines;
  const ghostBinds = m.ghost <= m.lineSink;
  const binding = ghostBinds ? m.ghost : m.lineSink;
  if (binding >= THIN_MARGIN) return lines;
  const limit = ghostBinds
    ? `the ghost limit (${microamps(g.worstUnlit.currentA)} of ${microamps(g.ghostLimitA)} µA, ${darkWhere(g.worstUnlit)})`
    : `the active-low line's rating (${milliamps(g.mostSunk.currentA, 3)} of ${milliamps(g.lineRatedA)} mA, ${darkWhere(g.mostSunk)})`;
  const divider = network.dividerOhms;
  const from =
    divider === null
      ? `no E24 pull-up from ${formatOhms(network.pullUpOhms)} up`
      : `no E24 step up from ${formatOhms(network.pullUpOhms)} pull-ups over ${formatOhms(divider)} upper resistors (${formatOhms(network.dividerLowerOhms ?? 0)} lower ones)`;
  const head = `thin margin, ${pct(binding)} to ${limit}: ${from} leaves ${pct(THIN_MARGIN)} there and keeps every limit`;
  // The steps the sizing tries from these values (ghostCheck.ts `roomSteps`), each solved.
  const steps = roomSteps(network, g);
  if (steps.length === 0) {
    lines.push(`${head} (and the largest tried)`);
    return lines;
  }
  const said = steps.map((step) => {
    const name =
      step.pullUpOhms !== network.pullUpOhms
        ? divider === null
          ? formatOhms(step.pullUpOhms)
          : `${formatOhms(step.pullUpOhms)} pull-ups`
        : `${formatOhms(step.dividerOhms ?? 0)} upper resistors`;
    const r = checkWith(project, spec, matrix, step, { design });
    if (!r.ok) return `${name}, could not be checked: ${r.error.message}`;
    const n = darkMargins(r.value);
    return `${name}, ${r.value.passes ? "passes too" : `breaks ${r.value.binding}`}: worst unlit ${microamps(r.value.worstUnlit.currentA)} µA (${pct(n.ghost)} below the limit), most sunk ${milliamps(r.value.mostSunk.currentA, 3)} mA, weakest lit ${milliamps(r.value.weakestLit.currentA, 3)} mA`;
  });
  lines.push(`${head}; the next one up, ${said.join("; or ")}`);
  return lines;
}
