/** Stage "matrix": the diode matrix, its independent verifier, and the designators of every part of the build. */
export { buildMatrix, busName, darkOutputs, darkSideDiodes, MATRIX_SCHEMA, matrixObjective, outputDecode } from "./matrix.ts";
export type { Diode, DiodeMatrix, Edge, Gate, InputNetwork, MatrixMeta, SynthesisMethod, VerifiedMatrix } from "./matrix.ts";
export { verifyMatrix } from "./verify.ts";
export { verifyPolarity } from "./verifyPolarity.ts";
export type { VerifyLimits } from "./verify.ts";
export { currentOhmsOf, currentRole, designators, diodeRef } from "./designators.ts";
export type { CurrentResistorRole, Designators, DriverParts, PartResistorRole, ResistorPart, StageResistor } from "./designators.ts";
