/**
 * The emitter follower (`emitter-follower`): the NPN's collector is on the
 * supply, its base on the output line (through the base resistor where one
 * is given); the emitter, about one Vbe below the base, feeds the series
 * resistor and the segment (a common-cathode display) to ground. The
 * current is (Vb - Vbe - n Vf) / Rs, so it follows the line's level.
 */
import type { CircuitElement } from "./circuit.ts";
import { GROUND, SUPPLY_NODE } from "./circuitNodes.ts";
import { segmentElement, segmentGuessV, type StageKind } from "./driverStage.ts";

export const emitterFollowerStage: StageKind = {
  kind: "emitter-follower",
  usesSupply: true,
  build({ parts: p, model, input }) {
    const o = p.output;
    const base = p.base !== null ? `b${o}` : input;
    const emitter = `e${o}`;
    const anode = `a${o}`;
    const dr = model.driver;
    if (p.transistor === null || p.series === null) throw new Error(`bug: a follower for ${o} without its transistor or series resistor`);
    const elements: CircuitElement[] = [];
    if (p.base !== null) elements.push({ kind: "resistor", name: p.base.ref, role: "base", a: input, b: base, ohms: p.base.ohms });
    elements.push({ kind: "npn", name: p.transistor, collector: SUPPLY_NODE, base, emitter, isA: dr.is, betaF: dr.betaF, betaR: dr.betaR });
    elements.push({ kind: "resistor", name: p.series.ref, role: "series", a: emitter, b: anode, ohms: p.series.ohms });
    elements.push(segmentElement(p, model, anode, GROUND));
    return {
      elements,
      nodes: { baseNode: base, emitterNode: emitter, collectorNode: SUPPLY_NODE, segmentAnode: anode, segmentCathode: GROUND },
      ownNodes: [emitter, anode, ...(p.base !== null ? [base] : [])],
    };
  },
  guess({ stage, model, inputV, lit }) {
    const g: Record<string, number> = {};
    if (stage.baseNode && stage.baseNode !== stage.inputNode) g[stage.baseNode] = lit ? inputV : 0;
    if (stage.emitterNode) g[stage.emitterNode] = lit ? inputV - 0.65 : 0;
    g[stage.segmentAnode] = lit ? segmentGuessV(model, model.segment.targetA) : 0;
    return g;
  },
};
