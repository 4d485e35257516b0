/**
 * The high-side switch (`high-side-switch`): a PNP whose emitter is on the
 * segment supply; the output line drives its base through the base
 * resistor, and the base-emitter resistor from the supply holds it off
 * while nothing pulls the line low. The collector feeds the series resistor
 * and the segment (a common-cathode display) to ground. It turns on when
 * its line is pulled low, so its lit cells are decoded onto the active-low
 * lines `nS<k>`. Saturated, the series resistor sets the current
 * (Vs - Vec(sat) - n Vf) / Rs.
 */
import type { CircuitElement } from "./circuit.ts";
import { GROUND, SUPPLY_NODE } from "./circuitNodes.ts";
import { DARK_GUESS_A, segmentElement, segmentGuessV, type StageKind } from "./driverStage.ts";

export const highSideSwitchStage: StageKind = {
  kind: "high-side-switch",
  usesSupply: true,
  build({ parts: p, model, input }) {
    const o = p.output;
    const base = `b${o}`;
    const collector = `c${o}`;
    const anode = `a${o}`;
    const dr = model.driver;
    if (p.transistor === null || p.series === null || p.base === null) {
      throw new Error(`bug: a high-side switch for ${o} without its transistor, base or series resistor`);
    }
    const elements: CircuitElement[] = [{ kind: "resistor", name: p.base.ref, role: "base", a: input, b: base, ohms: p.base.ohms }];
    if (p.baseEmitter !== null) {
      elements.push({ kind: "resistor", name: p.baseEmitter.ref, role: "base-emitter", a: SUPPLY_NODE, b: base, ohms: p.baseEmitter.ohms });
    }
    elements.push({ kind: "pnp", name: p.transistor, collector, base, emitter: SUPPLY_NODE, isA: dr.is, betaF: dr.betaF, betaR: dr.betaR });
    elements.push({ kind: "resistor", name: p.series.ref, role: "series", a: collector, b: anode, ohms: p.series.ohms });
    elements.push(segmentElement(p, model, anode, GROUND));
    return {
      elements,
      nodes: { baseNode: base, emitterNode: SUPPLY_NODE, collectorNode: collector, segmentAnode: anode, segmentCathode: GROUND },
      ownNodes: [collector, anode, base],
    };
  },
  guess({ stage, model, inputV }) {
    const g: Record<string, number> = {};
    const vs = model.supply.volts;
    // On while its line sits well below the supply.
    const lit = inputV < vs - 1.2;
    if (lit) {
      const i = model.segment.targetA;
      const led = segmentGuessV(model, i);
      if (stage.baseNode) g[stage.baseNode] = vs - 0.75;
      if (stage.collectorNode) g[stage.collectorNode] = led + (stage.series?.ohms ?? 0) * i;
      g[stage.segmentAnode] = led;
    } else {
      if (stage.baseNode) g[stage.baseNode] = vs;
      const a = segmentGuessV(model, DARK_GUESS_A);
      if (stage.collectorNode) g[stage.collectorNode] = a;
      g[stage.segmentAnode] = a;
    }
    return g;
  },
};
