/**
 * Sizes of the matrix drawing in millimetres, at each scale the layout tries.
 */

/**
 * Sizes of the matrix part of a drawing, millimetres, at a scale. Small
 * matrices are drawn larger (up to 1.5 times), as long as that costs no
 * extra sheet, so that they read easily at the bench.
 */
export interface Metrics {
  readonly scale: number;
  /** Offset of both diode taps from the crossing, along the row and down the column. */
  readonly tap: number;
  /** Wire overshoot beyond the last tap or crossing, so that every tap is a T-joint. */
  readonly overshoot: number;
  readonly pitchY: number;
  readonly minPitchX: number;
  readonly leftPad: number;
  readonly topPad: number;
  readonly refSize: number;
  readonly rowSize: number;
  readonly columnSize: number;
  readonly groupSize: number;
  readonly contSize: number;
  readonly dotR: number;
  /** Half the length (and half the width) of the diode triangle. */
  readonly symbolHalf: number;
  /** Width of the strips that hold continuation marks, left and right. */
  readonly stripW: number;
  /** Height of the strips that hold continuation marks, top and bottom. */
  readonly stripH: number;
  readonly terminalH: number;
  readonly arrow: number;
}

/**
 * Scales tried, largest first. At 0.9 the diode references are 1.8 mm high,
 * the smallest lettering of the ISO 3098 series; nothing is drawn smaller.
 */
export const SCALES = [1.5, 1.25, 1, 0.9] as const;

export function metrics(scale: number): Metrics {
  const k = (v: number): number => Math.round(v * scale * 1000) / 1000;
  return {
    scale,
    tap: k(3.5),
    // tap + overshoot stays inside the cell (under leftPad and pitchY - topPad), so no stub pokes into the next sheet.
    overshoot: k(0.8),
    pitchY: k(6),
    minPitchX: k(10),
    leftPad: k(4.8),
    topPad: k(1.6),
    refSize: k(2.0),
    rowSize: k(2.5),
    columnSize: k(2.2),
    groupSize: 2.2,
    contSize: Math.max(1.8, k(1.8)),
    dotR: k(0.5),
    symbolHalf: k(0.9),
    stripW: k(8.5),
    stripH: k(4.5),
    terminalH: k(4.5),
    arrow: k(1.2),
  };
}
/** Gap between the matrix, the notes and the title block, millimetres. */
export const GAP = 3;
