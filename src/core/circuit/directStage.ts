/**
 * Direct drive (`direct`): no transistor; the output line feeds the series
 * resistor and the segment to ground, so the counter lines carry the
 * segments' current through the matrix: (Vline - n Vd - n Vf) / Rs.
 */
import { GROUND } from "./circuitNodes.ts";
import { segmentElement, segmentGuessV, type StageKind } from "./driverStage.ts";

export const directStage: StageKind = {
  kind: "direct",
  usesSupply: false,
  build({ parts: p, model, input }) {
    const anode = `a${p.output}`;
    if (p.series === null) throw new Error(`bug: direct drive of ${p.output} without its series resistor`);
    return {
      elements: [
        { kind: "resistor", name: p.series.ref, role: "series", a: input, b: anode, ohms: p.series.ohms },
        segmentElement(p, model, anode, GROUND),
      ],
      nodes: { baseNode: null, emitterNode: null, collectorNode: null, segmentAnode: anode, segmentCathode: GROUND },
      ownNodes: [anode],
    };
  },
  guess({ stage, model, lit }) {
    return { [stage.segmentAnode]: lit ? segmentGuessV(model, model.segment.targetA) : 0 };
  },
};
