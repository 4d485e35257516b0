/**
 * How many counter states a budget checks within the work of its time
 * limit. Like the optimizer's budgets (synth/workBudget.ts) the plan comes
 * from the configured limit and the circuit's size alone, never from the
 * clock, so the same project checks the same states on an idle machine and
 * a busy one; the clock stays the safety net (`BudgetOptions.deadlineMs`).
 *
 * A budget solves every state's circuit once per sweep, and settling the
 * design takes several sweeps (nominal, the trim and its steps, the high
 * corner of each candidate, the lowest supply, both corners). Where the
 * limit's work does not cover every state that many times, the budget
 * checks the first states, S0 onwards, in every sweep, and says which it
 * did not check (`Budget.coverage`).
 */

/**
 * Sweeps over the states a budget is planned at: 9 to 15 measured (the
 * relay hex monitor, 00-59, 00-99, 256 states on 8 positions: nominal, 4 to
 * 8 of the trim, 2 to 4 at the high corner, the lowest supply, the low
 * corner); more where the trim steps towards the middle.
 */
const SWEEPS = 16;

/**
 * Work units of one state's solve, for a circuit of `elements` elements: a
 * part that grows with the elements (stamping, Newton's iterations) and one
 * that grows with their square (more iterations on a bigger circuit, 15 to
 * 26 against 7 to 15, and the elimination's fill). Fitted to CPU times
 * measured on this 2-core machine, whole budgets in a fresh process: 2.2 ms
 * a state for 00-99 on two positions (555 elements, about 820 000 units a
 * millisecond) and 240 ms for 256 states on 8 positions of a 32-segment
 * cell (11 533 elements, split solves; about 690 000).
 */
function solveUnits(elements: number): number {
  return elements * (elements + 2_700);
}

/** Work units per CPU millisecond: below the rates measured (above), so that a loaded machine keeps to the plan. */
const UNITS_PER_MS = 500_000;

/**
 * Share of the time limit the plan fills: the budget normally ends at about
 * half its limit, and inside it on a machine loaded twice over.
 */
const SHARE = 0.5;

/**
 * How many states, from S0, a budget checks: every one where the time
 * limit's work allows, else as many as it covers (at least one).
 *
 * @param elements the elements of one state's circuit (every state's has as many)
 * @param states the counter's states
 * @param timeLimitMs the configured time limit, milliseconds
 * @example
 * checkedStates(555, 100, 20_000); // 100: every state of a 00-99 clock
 * checkedStates(11_533, 256, 20_000); // 1: of a 256-state, 8-position matrix (14 at 150 s)
 */
export function checkedStates(elements: number, states: number, timeLimitMs: number): number {
  if (!(timeLimitMs > 0)) throw new RangeError(`timeLimitMs must be above 0, got ${timeLimitMs}`);
  const perState = SWEEPS * solveUnits(Math.max(1, elements));
  const work = timeLimitMs * SHARE * UNITS_PER_MS;
  return Math.max(1, Math.min(states, Math.floor(work / perState)));
}
