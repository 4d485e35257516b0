/**
 * Device equations of the DC solver: the Shockley diode and the Ebers-Moll
 * transport model of an NPN and a PNP transistor, each with its derivatives, plus the
 * junction-voltage limiting that keeps Newton-Raphson from overflowing.
 *
 * The equations are the ones a SPICE level-1 model uses with only IS, N
 * (diode) and IS, BF, BR (transistor) set, including SPICE's habit of putting
 * GMIN in parallel with every junction, so that a SPICE run of the exported
 * netlist solves the same equations.
 */

/** A two-terminal junction evaluated at one voltage. */
export interface JunctionPoint {
  /** Current from anode to cathode, amperes. */
  readonly currentA: number;
  /** dI/dV, siemens. */
  readonly conductanceS: number;
}

/**
 * Shockley diode I = Is (e^(V / (n VT)) - 1), with `gminS` in parallel.
 *
 * @param vV anode-to-cathode voltage, volts
 * @param isA saturation current, amperes
 * @param nVtV emission coefficient times thermal voltage, volts
 * @param gminS parallel conductance, siemens (SPICE's GMIN)
 */
export function diodeJunction(vV: number, isA: number, nVtV: number, gminS: number): JunctionPoint {
  return { currentA: diodeCurrent(vV, isA, nVtV, gminS), conductanceS: diodeConductance(vV, isA, nVtV, gminS) };
}

/** The current of `diodeJunction` alone, amperes (no object: the solver's inner loop). */
export function diodeCurrent(vV: number, isA: number, nVtV: number, gminS: number): number {
  return isA * (Math.exp(vV / nVtV) - 1) + gminS * vV;
}

/** The conductance of `diodeJunction` alone, siemens. */
export function diodeConductance(vV: number, isA: number, nVtV: number, gminS: number): number {
  return (isA * Math.exp(vV / nVtV)) / nVtV + gminS;
}

/** Ebers-Moll transport parameters of an NPN or a PNP (IS, BF, BR; NF = NR = 1). */
export interface NpnParams {
  /** Transport saturation current, amperes. */
  readonly isA: number;
  readonly betaF: number;
  readonly betaR: number;
}

/** Terminal currents of an NPN and their partial derivatives. */
export interface NpnPoint {
  /** Current into the collector, amperes. */
  readonly icA: number;
  /** Current into the base, amperes. */
  readonly ibA: number;
  /** dIc/dVbe, dIc/dVbc, dIb/dVbe, dIb/dVbc, siemens. */
  readonly dIcVbe: number;
  readonly dIcVbc: number;
  readonly dIbVbe: number;
  readonly dIbVbc: number;
}

/**
 * Ebers-Moll transport model, exactly as SPICE's Gummel-Poon model reduces
 * to with only IS, BF and BR set (no Early effect, no ohmic resistances):
 *
 *   Ic = Is (e^(Vbe/VT) - e^(Vbc/VT)) - (Is/BR)(e^(Vbc/VT) - 1)
 *   Ib = (Is/BF)(e^(Vbe/VT) - 1) + (Is/BR)(e^(Vbc/VT) - 1)
 *
 * plus `gminS` across each junction (SPICE adds GMIN Vbe and GMIN Vbc to the
 * base current and takes GMIN Vbc from the collector current).
 *
 * @param vbeV base-emitter voltage, volts
 * @param vbcV base-collector voltage, volts
 * @param vtV thermal voltage, volts
 */
export function npnTransport(vbeV: number, vbcV: number, p: NpnParams, vtV: number, gminS: number): NpnPoint {
  const ebe = Math.exp(vbeV / vtV);
  const ebc = Math.exp(vbcV / vtV);
  const cbe = p.isA * (ebe - 1);
  const cbc = p.isA * (ebc - 1);
  const gbe = (p.isA * ebe) / vtV;
  const gbc = (p.isA * ebc) / vtV;
  return {
    icA: cbe - cbc - cbc / p.betaR - gminS * vbcV,
    ibA: cbe / p.betaF + cbc / p.betaR + gminS * (vbeV + vbcV),
    dIcVbe: gbe,
    dIcVbc: -gbc - gbc / p.betaR - gminS,
    dIbVbe: gbe / p.betaF + gminS,
    dIbVbc: gbc / p.betaR + gminS,
  };
}

/**
 * Ebers-Moll transport model of a PNP: the NPN's equations with every
 * voltage and current turned round (SPICE's BJT with TYPE = -1), so the
 * same IS, BF and BR describe it:
 *
 *   Ic = Is (e^(Veb/VT) - e^(Vcb/VT)) - (Is/BR)(e^(Vcb/VT) - 1)   out of the collector
 *   Ib = (Is/BF)(e^(Veb/VT) - 1) + (Is/BR)(e^(Vcb/VT) - 1)          out of the base
 *
 * with `gminS` across each junction as for the NPN. The point's currents
 * are out of the collector and the base (the emitter takes their sum in),
 * its derivatives with respect to Veb and Vcb.
 *
 * @param vebV emitter-base voltage, volts (forward: the emitter above the base)
 * @param vcbV collector-base voltage, volts
 * @param vtV thermal voltage, volts
 * @example
 * pnpTransport(0.65, -4, { isA: 1e-14, betaF: 150, betaR: 3 }, 0.025852, 0).icA; // 8.3e-4 A, out of the collector
 */
export function pnpTransport(vebV: number, vcbV: number, p: NpnParams, vtV: number, gminS: number): NpnPoint {
  // The mirror image: an NPN's equations at the junction voltages measured the other way.
  return npnTransport(vebV, vcbV, p, vtV, gminS);
}

/**
 * The junction voltage above which limiting starts (SPICE's vcrit):
 * n VT ln(n VT / (sqrt(2) Is)).
 */
export function criticalVoltage(isA: number, nVtV: number): number {
  return nVtV * Math.log(nVtV / (Math.SQRT2 * isA));
}

/**
 * SPICE's pnjlim: limits a junction's new Newton voltage against the one it
 * was last evaluated at, so that e^(V/(n VT)) grows by at most a bounded
 * factor per iteration. Acts only when the new voltage is above vcrit and
 * the step exceeds 2 n VT.
 *
 * @returns the voltage to evaluate at; a value other than `vNewV` means it was limited
 */
export function limitJunction(vNewV: number, vOldV: number, nVtV: number, vcritV: number): number {
  if (vNewV > vcritV && Math.abs(vNewV - vOldV) > 2 * nVtV) {
    if (vOldV > 0) {
      const arg = 1 + (vNewV - vOldV) / nVtV;
      return arg > 0 ? vOldV + nVtV * Math.log(arg) : vcritV;
    }
    return nVtV * Math.log(vNewV / nVtV);
  }
  return vNewV;
}
