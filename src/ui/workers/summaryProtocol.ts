/**
 * Messages between the app and the summary worker, which works out the
 * instrument summary off the main thread: one decoder at a time, its matrix
 * (the exact optimizer, as the command line runs it), its budget and its
 * parts count; then, once every decoder has its budget, the instrument's
 * budget from them (core/budget/instrumentBudget.ts, as `diodeloom budget`
 * works it out).
 */
import type { BudgetFailure } from "../../core/budget/budget.ts";
import type { Budget } from "../../core/budget/budgetTypes.ts";
import type { InstrumentBudget } from "../../core/budget/instrumentBudget.ts";
import type { TrimMode } from "../../core/budget/segmentDesign.ts";
import type { Result } from "../../core/result/result.ts";

export type SummaryRequest =
  | {
      readonly id: number;
      readonly job: "decoder";
      /** One decoder as a single-decoder project draft; the worker validates it itself. */
      readonly project: unknown;
      readonly trim: TrimMode;
    }
  | {
      readonly id: number;
      readonly job: "instrument";
      readonly title: string;
      /** Every decoder with the matrix and budget its own job gave; the worker checks each matrix again. */
      readonly decoders: readonly { readonly name: string; readonly project: unknown; readonly matrix: unknown; readonly budget: Budget }[];
      /** Time the corner solves may take, milliseconds. */
      readonly timeLimitMs: number;
    };

/** One decoder's figures for the summary. */
export interface DecoderFigures {
  /** Every diode the decoder needs: the matrix's (with a coded counter's gate diodes and a dark decode's level-shift diodes). */
  readonly diodes: number;
  /** The driver transistors. */
  readonly transistors: number;
  /** Every resistor of the design (current-setting, base, pull-down, tie-on, gate pull-up). */
  readonly resistors: number;
  /** True when the matrix is the proven smallest. */
  readonly optimal: boolean;
  /** The verified matrix, as plain data, for the instrument's budget. */
  readonly matrix: unknown;
  /** The budget of the design; its failure keeps the parts count (with the project's resistor values). */
  readonly budget: Result<Budget, BudgetFailure | { readonly kind: "rejected"; readonly message: string }>;
}

export type InstrumentOutcome = Result<InstrumentBudget, { readonly kind: string; readonly message: string; readonly decoder?: string }>;

export type SummaryReply =
  | { readonly id: number; readonly type: "figures"; readonly figures: DecoderFigures }
  | { readonly id: number; readonly type: "instrument"; readonly result: InstrumentOutcome }
  | { readonly id: number; readonly type: "failed"; readonly message: string };
