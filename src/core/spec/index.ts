/** Stage "spec": the decode spec a project asks for, and the counter's code table. */
export { compileSpec, litCellCount, outputName, stateName } from "./decodeSpec.ts";
export type { DecodeSpec } from "./decodeSpec.ts";
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
