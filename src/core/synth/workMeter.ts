/**
 * The deterministic stop of every synthesis phase: a count of work units
 * against a budget, plus the clock as a safety net.
 *
 * A phase charges the meter for the work it does (cells looked at, items
 * tried) and stops when the budget is spent, so the same input and budget
 * stop it at the same point on any machine. The deadline is looked at only
 * every so many units (reading the clock costs more than a unit of work);
 * when it has passed, the meter counts as spent too and remembers it, so the
 * result can say that the clock, not the budget, ended the run.
 */

/** Work units between two looks at the clock. */
const CLOCK_EVERY = 1 << 15;

export class WorkMeter {
  /** Units charged so far. */
  work = 0;
  /** True once the deadline has stopped this meter. */
  deadlineHit = false;
  private nextClock = CLOCK_EVERY;

  /**
   * @param maxWork the budget, in the phase's units
   * @param deadlineMs a `Date.now()` value past which the meter counts as spent (the safety net)
   */
  constructor(
    readonly maxWork: number,
    readonly deadlineMs: number = Infinity,
  ) {}

  /**
   * Charges `units` and says whether the budget or the deadline is spent.
   *
   * @example
   * const meter = new WorkMeter(1e6, Date.now() + 2000);
   * for (const row of rows) if (meter.charge(row.length)) break;
   */
  charge(units: number): boolean {
    this.work += units;
    return this.spent();
  }

  /** True when the budget is used up or the deadline has passed. */
  spent(): boolean {
    if (this.work >= this.maxWork) return true;
    if (this.deadlineHit) return true;
    if (this.deadlineMs !== Infinity && this.work >= this.nextClock) {
      this.nextClock = this.work + CLOCK_EVERY;
      if (Date.now() > this.deadlineMs) this.deadlineHit = true;
    }
    return this.deadlineHit;
  }

  /**
   * A meter for one of `parts` pieces of what is left of this budget, with
   * the same deadline, and at most `most` units; `settle` charges its work
   * back here.
   */
  portion(parts: number, most = Infinity): WorkMeter {
    const share = Math.max(0, Math.floor((this.maxWork - this.work) / Math.max(1, parts)));
    return new WorkMeter(Math.min(most, share), this.deadlineMs);
  }

  /** Charges a portion's work (see `portion`) to this meter. */
  settle(portion: WorkMeter): void {
    this.work += portion.work;
    if (portion.deadlineHit) this.deadlineHit = true;
  }

  /** Looks at the clock now, whatever the work done (for phases that charge in big steps). */
  checkClock(): boolean {
    if (!this.deadlineHit && this.deadlineMs !== Infinity && Date.now() > this.deadlineMs) this.deadlineHit = true;
    return this.spent();
  }
}
