/** Stage "matrix": the diode matrix, its independent verifier, and the designators of every part of the build. */
export { buildMatrix, busName, MATRIX_SCHEMA } from "./matrix.ts";
export type { Diode, DiodeMatrix, Edge, Gate, MatrixMeta, SynthesisMethod, VerifiedMatrix } from "./matrix.ts";
export { verifyMatrix } from "./verify.ts";
export type { VerifyLimits } from "./verify.ts";
export { currentOhmsOf, currentRole, designators, diodeRef } from "./designators.ts";
export type { CurrentResistorRole, Designators, DriverParts, PartResistorRole, ResistorPart, StageResistor } from "./designators.ts";
