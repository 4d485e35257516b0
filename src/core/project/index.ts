/**
 * Stage 0 of the pipeline: the project file, read and checked once.
 */
export { PROJECT_SCHEMA, PROJECT_SCHEMA_V1 } from "./project.ts";
export type {
  Cell,
  CellFigure,
  CellKind,
  CounterCodeKind,
  FigurePoint,
  SegmentShape,
  CounterOutputModel,
  CounterSection,
  DepthPolicy,
  DiodeModel,
  DriverKind,
  DriverModel,
  ElectricalModel,
  LogicSupplyModel,
  PresetName,
  Project,
  SegmentModel,
  SupplyModel,
  SynthesisFields,
  SynthesisOptions,
  ToleranceModel,
} from "./project.ts";
export { LIMITS, fileSizeProblem } from "./limits.ts";
export { COUNTER_CODES, CounterSectionSchema, checkCounter } from "./counterSchema.ts";
export type { LooseCounter } from "./counterSchema.ts";
export type { WholeRange } from "./limits.ts";
export { DRIVER_KINDS, ELECTRICAL_DEFAULTS, ELECTRICAL_RANGES, electricalOf, electricalOfV1, segmentDropV } from "./electricalSchema.ts";
export type { LooseElectrical, LooseElectricalV1, RangeRule } from "./electricalSchema.ts";
export { DEFAULT_PRESET, ELECTRICAL_PRESETS, FORMAT1_ELECTRICAL, PRESET_INFO, PRESET_NAMES } from "./electricalPresets.ts";
export type { PresetInfo } from "./electricalPresets.ts";
export { DEPTH_POLICIES, SYNTHESIS_DEFAULTS, checkSynthesisOverrides, numberFromText } from "./synthesisSchema.ts";
export type { SynthesisOverrides } from "./synthesisSchema.ts";
export { MAX_PROJECT_BYTES, parseProject, splitText, validateProject } from "./projectSchema.ts";
export type { TextPosition } from "./projectSchema.ts";
export { decodeProjectBytes, firstInvalidUtf8, parseProjectBytes } from "./projectBytes.ts";
export { lineColumn, readJson } from "./jsonText.ts";
export type { JsonRead, JsonReadOptions } from "./jsonText.ts";
export { EXCERPT_CHARS, describeValue, fieldPath, hasUnsafeText, quoteText } from "./valueText.ts";
export { numberRuleText } from "./fieldRules.ts";
export type { NumberRule } from "./fieldRules.ts";
export { electricalFields, serializeProject, synthesisFields } from "./projectWriter.ts";
export { fillPattern } from "./textPatterns.ts";
export { FIGURE_BOX, FIGURE_DEFAULTS, POLYLINE_POINTS, figureFields, figureOf } from "./figureSchema.ts";
export type { LooseFigure } from "./figureSchema.ts";
export {
  DECODER_KEYS,
  INSTRUMENT_KEYS,
  SINGLE_DECODER_NAME,
  mergeLoose,
  parseInstrument,
  parseInstrumentBytes,
  serializeInstrument,
  validateInstrument,
} from "./instrument.ts";
export type { Instrument, InstrumentDecoder } from "./instrument.ts";
