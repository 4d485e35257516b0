import { describe, expect, it } from "vitest";
import { validateProject } from "../../../../src/core/project/projectSchema.ts";
import { draftFromProject, type Draft } from "../../../../src/ui/state/draft.ts";
import { setSynthesis, setText } from "../../../../src/ui/state/draftEdits.ts";
import { fieldLabel, fileProblemLine, problemSentence } from "../../../../src/ui/state/problemWords.ts";
import { example, showing } from "../../../support/projects.ts";

/** The app's sentences for a draft's problems. */
function said(d: Draft): string[] {
  const v = validateProject(d);
  if (v.ok) return [];
  return v.error.map((p) => problemSentence(p, d));
}

describe("problems in the user's words", () => {
  it("says what is wrong with a state's text, without the file's field paths", () => {
    const d = setText(draftFromProject(showing(["10", "11", "12", "13", "14", "15"], 2)), 5, "123");
    expect(said(d)).toEqual(['State 5\'s text "123" has 3 characters; this display has 2 positions: shorten it, or add positions']);
    const short = setText(d, 5, "1");
    expect(said(short)).toEqual([
      'State 5\'s text "1" has 1 character; this display has 2 positions: pad it with spaces for blanks, or take positions away',
    ]);
    const unknown = setText(d, 5, "1W");
    expect(said(unknown)).toEqual(['State 5\'s text "1W" shows "W", which has no shape yet: add it in Glyphs with Add character']);
    for (const s of [...said(d), ...said(short), ...said(unknown)]) expect(s).not.toMatch(/show\[|display\.positions|"glyphs"/);
  });

  it("names the form's fields, not the file's paths", () => {
    const d = setSynthesis(draftFromProject(example("relay-hex-monitor")), { maxDepth: 7 });
    expect(said(d)).toEqual(["Depth limit: got 7; must be a whole number from 1 to 3"]);
    expect(said(setSynthesis(d, { maxDepth: 2, timeLimitMs: 0 }))).toEqual(["Exact limit: got 0 s; must be from 0.001 to 3600 seconds"]);
    expect(fieldLabel("synthesis.depth")).toBe("Depth policy");
    expect(fieldLabel("glyphs.7")).toBe('Glyph "7"');
    expect(fieldLabel("electrical.driver.emitterResistors.1a")).toBe("Electrical › Driver › Emitter resistor per output › 1a");
    // The Electrical panel's names and units.
    expect(fieldLabel("electrical.segment.targetA")).toBe("Electrical › Segment › Target current (mA)");
    expect(fieldLabel("electrical.supply.volts")).toBe("Electrical › Segment supply › Nominal (V)");
    expect(fieldLabel("electrical.tolerance.temperatureC[1]")).toBe("Electrical › Tolerances and temperature › Highest temperature (°C)");
  });

  it("keeps the file's path beside the words for a file that was opened, so it can be found there", () => {
    expect(fileProblemLine({ path: "counter.states", message: "got 1; must be a whole number from 2 to 256" })).toBe(
      "States (counter.states in the file): got 1; must be a whole number from 2 to 256",
    );
    expect(fileProblemLine({ path: "", message: "not valid JSON: unexpected end at line 1, column 7" })).toBe(
      "not valid JSON: unexpected end at line 1, column 7",
    );
  });
});
