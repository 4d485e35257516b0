/**
 * How much room the dark-decoded outputs' sized network leaves, in words,
 * for `synth` and `budget`: the margin to each limit of the ghost check,
 * and, where the margin to the limit that stops a smaller value is thin
 * (the sizing could not leave more), what the next E24 value up would give
 * (solved, every state at both corners).
 */
import { checkWith, PULL_UP_ROOM, pullUpCandidates } from "../core/budget/ghostCheck.ts";
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
 * saying so and, for level-shift diodes, what the next E24 pull-up up gives.
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
  if (network.dividerOhms !== null) {
    lines.push(
      `thin margin, ${pct(binding)} to ${limit}: the divider's ${formatOhms(network.dividerOhms)} is the smallest E24 upper resistor that passes with its ${formatOhms(network.dividerLowerOhms ?? 0)} lower one; a larger one leaves more room and the lit segments less current`,
    );
    return lines;
  }
  const next = pullUpCandidates().find((r) => r > network.pullUpOhms);
  const head = `thin margin, ${pct(binding)} to ${limit}: no E24 pull-up from ${formatOhms(network.pullUpOhms)} up leaves ${pct(THIN_MARGIN)} there and keeps every limit`;
  if (next === undefined) {
    lines.push(`${head} (and the largest tried)`);
    return lines;
  }
  const r = checkWith(project, spec, matrix, { ...network, pullUpOhms: next }, { design });
  if (!r.ok) {
    lines.push(`${head}; the next one up, ${formatOhms(next)}, could not be checked: ${r.error.message}`);
    return lines;
  }
  const n = darkMargins(r.value);
  lines.push(
    `${head}; the next one up, ${formatOhms(next)}, ${r.value.passes ? "passes too" : `breaks ${r.value.binding}`}: worst unlit ${microamps(r.value.worstUnlit.currentA)} µA (${pct(n.ghost)} below the limit), most sunk ${milliamps(r.value.mostSunk.currentA, 3)} mA, weakest lit ${milliamps(r.value.weakestLit.currentA, 3)} mA`,
  );
  return lines;
}
