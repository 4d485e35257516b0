/**
 * Messages between the app and the summary worker, which works out one
 * decoder of the instrument at a time for the instrument summary: its
 * matrix (the exact optimizer, as the command line runs it), its budget and
 * its parts count, off the main thread.
 */
import type { BudgetFailure } from "../../core/budget/budget.ts";
import type { Budget } from "../../core/budget/budgetTypes.ts";
import type { TrimMode } from "../../core/budget/segmentDesign.ts";
import type { Result } from "../../core/result/result.ts";

export interface SummaryRequest {
  readonly id: number;
  /** One decoder as a single-decoder project draft; the worker validates it itself. */
  readonly project: unknown;
  readonly trim: TrimMode;
}

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
  /** The budget of the design; its failure keeps the parts count (with the project's resistor values). */
  readonly budget: Result<Budget, BudgetFailure | { readonly kind: "rejected"; readonly message: string }>;
}

export type SummaryReply =
  | { readonly id: number; readonly type: "figures"; readonly figures: DecoderFigures }
  | { readonly id: number; readonly type: "failed"; readonly message: string };
