import fc from "fast-check";
import { SEG7_GLYPHS } from "../../src/core/glyphs/glyphs.ts";

const SEG7_CHARS = Object.keys(SEG7_GLYPHS);

/** Random valid project documents (loose JSON form): seg7 or custom cells, 1-3 positions, 2-40 states. */
export const projectDoc = fc
  .record({
    states: fc.integer({ min: 2, max: 40 }),
    positions: fc.integer({ min: 1, max: 3 }),
    custom: fc.boolean(),
    customSegments: fc.integer({ min: 1, max: 9 }),
    seed: fc.integer({ min: 0, max: 1_000_000 }),
  })
  .chain(({ states, positions, custom, customSegments }) => {
    const segments = Array.from({ length: customSegments }, (_, i) => `s${i}`);
    const glyphArb = custom
      ? fc.dictionary(fc.constantFrom(..."pqrstuvw"), fc.subarray(segments), { minKeys: 1, maxKeys: 6 })
      : fc.constant({} as Record<string, string[]>);
    return glyphArb.chain((glyphs) => {
      const chars = custom ? [" ", ...Object.keys(glyphs)] : SEG7_CHARS;
      const text = fc.array(fc.constantFrom(...chars), { minLength: positions, maxLength: positions }).map((cs) => cs.join(""));
      return fc.array(text, { minLength: states, maxLength: states }).map((show) => ({
        schema: "diodeloom/project@1",
        title: "random",
        counter: { states, drive: "source" },
        display: custom ? { positions, cell: "custom", segments } : { positions, cell: "seg7" },
        glyphs,
        show,
      }));
    });
  });
