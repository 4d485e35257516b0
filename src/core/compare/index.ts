/** Glyph-style comparison: the exports of the stage. */
export { COMPARE_SCHEMA, compareGlyphStyles, figureStatus, rowKey, variantChoices, withGlyphs } from "./glyphStyles.ts";
export type { CompareOptions, FigureStatus, GlyphStyleRow, RowDone, RowStart } from "./glyphStyles.ts";
export { comparePolarities, DECODE_ROWS } from "./polarityRows.ts";
export type { PolarityCompareOptions, PolarityRow } from "./polarityRows.ts";
