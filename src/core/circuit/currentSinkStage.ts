/**
 * The current sink (`current-sink`): the NPN's base is the output line, its
 * emitter goes to ground through the emitter resistor, which sets the
 * current (Vb - Vbe) / Re; the segment hangs from the supply on the
 * collector, with a collector resistor between where one is given.
 */
import type { CircuitElement } from "./circuit.ts";
import { GROUND, SUPPLY_NODE } from "./circuitNodes.ts";
import { DARK_GUESS_A, segmentElement, segmentGuessV, type StageKind } from "./driverStage.ts";

export const currentSinkStage: StageKind = {
  kind: "current-sink",
  usesSupply: true,
  build({ parts: p, model, input }) {
    const o = p.output;
    const emitter = `e${o}`;
    const collector = `c${o}`;
    const cathode = p.series !== null ? `k${o}` : collector;
    const dr = model.driver;
    const elements: CircuitElement[] = [];
    if (p.transistor === null || p.emitter === null)
      throw new Error(`bug: a current sink for ${o} without its transistor or emitter resistor`);
    elements.push({ kind: "npn", name: p.transistor, collector, base: input, emitter, isA: dr.is, betaF: dr.betaF, betaR: dr.betaR });
    elements.push({ kind: "resistor", name: p.emitter.ref, role: "emitter", a: emitter, b: GROUND, ohms: p.emitter.ohms });
    if (p.series !== null)
      elements.push({ kind: "resistor", name: p.series.ref, role: "series", a: cathode, b: collector, ohms: p.series.ohms });
    elements.push(segmentElement(p, model, SUPPLY_NODE, cathode));
    return {
      elements,
      nodes: { baseNode: input, emitterNode: emitter, collectorNode: collector, segmentAnode: SUPPLY_NODE, segmentCathode: cathode },
      ownNodes: p.series !== null ? [collector, cathode, emitter] : [collector, emitter],
    };
  },
  guess({ stage, model, inputV, lit }) {
    const i = lit ? model.segment.targetA : DARK_GUESS_A;
    const k = model.supply.volts - segmentGuessV(model, i);
    const g: Record<string, number> = {};
    if (stage.emitterNode) g[stage.emitterNode] = lit ? inputV - 0.6 : 0;
    if (stage.collectorNode) g[stage.collectorNode] = k - (stage.series?.ohms ?? 0) * i;
    g[stage.segmentCathode] = k;
    return g;
  },
};
