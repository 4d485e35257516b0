/** Stage "spec": the decode spec a project asks for, and the counter's code table. */
export { activeLowName, compileSpec, litCellCount, litPolarity, outputName, stateName } from "./decodeSpec.ts";
export type { DecodeSpec, OutputPolarity, SpecPolarity } from "./decodeSpec.ts";
export { levelShift, MAX_LEVEL_SHIFT_DIODES } from "./levelShift.ts";
export type { LevelShift } from "./levelShift.ts";
export {
  binaryCodes,
  binaryStages,
  counterCode,
  johnsonCodes,
  literalHigh,
  literalName,
  literalOf,
  stageBit,
  stageLines,
} from "./counterCode.ts";
export type { CounterCode, Literal } from "./counterCode.ts";
