/** Stage "circuit": the netlist of every counter state as data, the device models, and the DC solve. */
export { buildCircuit, circuitFrame, GROUND, LOGIC_NODE, lineNode, stateCircuit, SUPPLY_NODE } from "./circuit.ts";
export type {
  Circuit,
  CircuitFrame,
  CircuitDiode,
  CircuitElement,
  DriverStage,
  LedSegment,
  Npn,
  Resistor,
  ResistorRole,
  VoltageSource,
} from "./circuit.ts";
export { DARK_GUESS_A, driverStage, segmentElement, segmentGuessV } from "./driverStage.ts";
export type { BuiltStage, GuessInput, StageInput, StageKind, StageNodes } from "./driverStage.ts";
export { currentSinkStage } from "./currentSinkStage.ts";
export { lowSideSwitchStage } from "./lowSideSwitchStage.ts";
export { emitterFollowerStage } from "./emitterFollowerStage.ts";
export { directStage } from "./directStage.ts";
export { DcWorkspace, DEFAULT_DC_SETTINGS, DEFAULT_GMIN_S, solveDc } from "./dcSolver.ts";
export type { DcFailure, DcMethod, DcSettings, OperatingPoint, TransistorCurrents } from "./dcSolver.ts";
export { criticalVoltage, diodeConductance, diodeCurrent, diodeJunction, limitJunction, npnTransport } from "./deviceModels.ts";
export type { JunctionPoint, NpnParams, NpnPoint } from "./deviceModels.ts";
export { SparsePattern, SparseSolver } from "./linearSolve.ts";
export { BOLTZMANN_J_PER_K, ELEMENTARY_CHARGE_C, shockleyVoltage, thermalVoltage, ZERO_CELSIUS_K } from "./physics.ts";
export { allSourceLines, highDrivers, highGates, highLines, isCoded, isGateInput, orPlane, sourceLines } from "./counterLines.ts";
export { isLit, segmentCurrents, solveAllStates, sweepStates } from "./stateSweep.ts";
export type { BudgetFailure, StateSolution, SweepOptions } from "./stateSweep.ts";
