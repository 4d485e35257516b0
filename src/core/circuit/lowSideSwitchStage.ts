/**
 * The low-side switch (`low-side-switch`): the output line drives the NPN's
 * base through the base resistor (a base-emitter resistor to ground where
 * one is given); the emitter is at ground; the segment (a common-anode
 * display) hangs from the supply, its cathode through the series resistor
 * to the collector. Saturated, the series resistor sets the current
 * (Vs - n Vf - Vce(sat)) / Rs.
 */
import type { CircuitElement } from "./circuit.ts";
import { GROUND, SUPPLY_NODE } from "./circuitNodes.ts";
import { DARK_GUESS_A, segmentElement, segmentGuessV, type StageKind } from "./driverStage.ts";

export const lowSideSwitchStage: StageKind = {
  kind: "low-side-switch",
  usesSupply: true,
  build({ parts: p, model, input }) {
    const o = p.output;
    const base = p.base !== null ? `b${o}` : input;
    const collector = `c${o}`;
    const cathode = `k${o}`;
    const dr = model.driver;
    if (p.transistor === null || p.series === null) throw new Error(`bug: a switch for ${o} without its transistor or series resistor`);
    const elements: CircuitElement[] = [];
    if (p.base !== null) elements.push({ kind: "resistor", name: p.base.ref, role: "base", a: input, b: base, ohms: p.base.ohms });
    if (p.baseEmitter !== null) {
      elements.push({ kind: "resistor", name: p.baseEmitter.ref, role: "base-emitter", a: base, b: GROUND, ohms: p.baseEmitter.ohms });
    }
    elements.push({ kind: "npn", name: p.transistor, collector, base, emitter: GROUND, isA: dr.is, betaF: dr.betaF, betaR: dr.betaR });
    elements.push({ kind: "resistor", name: p.series.ref, role: "series", a: cathode, b: collector, ohms: p.series.ohms });
    elements.push(segmentElement(p, model, SUPPLY_NODE, cathode));
    return {
      elements,
      nodes: { baseNode: base, emitterNode: null, collectorNode: collector, segmentAnode: SUPPLY_NODE, segmentCathode: cathode },
      ownNodes: [collector, cathode, ...(p.base !== null ? [base] : [])],
    };
  },
  guess({ stage, model, lit }) {
    const g: Record<string, number> = {};
    if (lit) {
      const i = model.segment.targetA;
      if (stage.baseNode && stage.baseNode !== stage.inputNode) g[stage.baseNode] = 0.75;
      if (stage.collectorNode) g[stage.collectorNode] = 0.1;
      g[stage.segmentCathode] = 0.1 + (stage.series?.ohms ?? 0) * i;
    } else {
      const k = model.supply.volts - segmentGuessV(model, DARK_GUESS_A);
      if (stage.baseNode && stage.baseNode !== stage.inputNode) g[stage.baseNode] = 0;
      if (stage.collectorNode) g[stage.collectorNode] = k;
      g[stage.segmentCathode] = k;
    }
    return g;
  },
};
