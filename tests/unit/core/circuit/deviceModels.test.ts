import { describe, expect, it } from "vitest";
import { criticalVoltage, diodeJunction, limitJunction, npnTransport, pnpTransport } from "../../../../src/core/circuit/deviceModels.ts";
import { thermalVoltage } from "../../../../src/core/circuit/physics.ts";

const VT = thermalVoltage(27);

describe("device models", () => {
  it("diode conductance is the derivative of its current", () => {
    for (const v of [-1, 0, 0.3, 0.6]) {
      const h = 1e-7;
      const p = diodeJunction(v, 4e-9, 1.9 * VT, 1e-12);
      const fd = (diodeJunction(v + h, 4e-9, 1.9 * VT, 1e-12).currentA - diodeJunction(v - h, 4e-9, 1.9 * VT, 1e-12).currentA) / (2 * h);
      expect(p.conductanceS / fd).toBeCloseTo(1, 5);
    }
    expect(diodeJunction(0, 1e-14, VT, 1e-12).currentA).toBe(0);
  });

  it("the NPN follows the issue's transport equations exactly", () => {
    const p = { isA: 1e-14, betaF: 150, betaR: 3 };
    for (const [vbe, vbc] of [
      [0.6, -50],
      [0.7, 0.5],
      [-1, -1],
      [0.65, 0.65],
    ] as const) {
      const r = npnTransport(vbe, vbc, p, VT, 0);
      const ebe = Math.exp(vbe / VT);
      const ebc = Math.exp(vbc / VT);
      expect(r.icA).toBeCloseTo(1e-14 * (ebe - ebc) - (1e-14 / 3) * (ebc - 1), 18);
      expect(r.ibA).toBeCloseTo((1e-14 / 150) * (ebe - 1) + (1e-14 / 3) * (ebc - 1), 18);
      const h = 1e-7;
      const d = (f: (a: number, b: number) => number, which: 0 | 1): number =>
        which === 0 ? (f(vbe + h, vbc) - f(vbe - h, vbc)) / (2 * h) : (f(vbe, vbc + h) - f(vbe, vbc - h)) / (2 * h);
      const ic = (a: number, b: number): number => npnTransport(a, b, p, VT, 1e-12).icA;
      const ib = (a: number, b: number): number => npnTransport(a, b, p, VT, 1e-12).ibA;
      const g = npnTransport(vbe, vbc, p, VT, 1e-12);
      const close = (x: number, y: number): void => expect(Math.abs(x - y)).toBeLessThanOrEqual(1e-6 * Math.abs(y) + 1e-13);
      close(g.dIcVbe, d(ic, 0));
      close(g.dIcVbc, d(ic, 1));
      close(g.dIbVbe, d(ib, 0));
      close(g.dIbVbc, d(ib, 1));
    }
  });

  it("the PNP is the NPN mirrored: the same equations at Veb and Vcb, currents out of the collector and base", () => {
    const p = { isA: 1e-14, betaF: 150, betaR: 3 };
    for (const [veb, vcb] of [
      [0.65, -4],
      [0.72, 0.5],
      [-1, -1],
    ] as const) {
      const q = pnpTransport(veb, vcb, p, VT, 1e-12);
      const ebe = Math.exp(veb / VT);
      const ebc = Math.exp(vcb / VT);
      expect(q.icA).toBeCloseTo(1e-14 * (ebe - ebc) - (1e-14 / 3) * (ebc - 1) - 1e-12 * vcb, 18);
      expect(q.ibA).toBeCloseTo((1e-14 / 150) * (ebe - 1) + (1e-14 / 3) * (ebc - 1) + 1e-12 * (veb + vcb), 18);
    }
  });

  it("puts GMIN across both junctions as SPICE does", () => {
    const p = { isA: 1e-14, betaF: 150, betaR: 3 };
    const a = npnTransport(0, -10, p, VT, 0);
    const b = npnTransport(0, -10, p, VT, 1e-12);
    expect(b.icA - a.icA).toBeCloseTo(10e-12, 20);
    expect(b.ibA - a.ibA).toBeCloseTo(-10e-12, 20);
  });

  it("limits junction steps above vcrit like pnjlim, and leaves small steps alone", () => {
    const vcrit = criticalVoltage(1e-14, VT);
    expect(limitJunction(0.5, 0.4, VT, vcrit)).toBe(0.5);
    expect(limitJunction(0.75, 0.74, VT, vcrit)).toBe(0.75);
    const up = limitJunction(5, 0.7, VT, vcrit);
    expect(up).toBeCloseTo(0.7 + VT * Math.log(1 + (5 - 0.7) / VT), 12);
    expect(limitJunction(5, -1, VT, vcrit)).toBeCloseTo(VT * Math.log(5 / VT), 12);
  });
});
