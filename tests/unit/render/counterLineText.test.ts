import { describe, expect, it } from "vitest";
import { noSourceLineText } from "../../../src/render/counterLineText.ts";
import type { Budget } from "../../../src/core/budget/budgetTypes.ts";

type Part = Pick<Budget, "kind" | "counterLines" | "dark">;
const darkSection = {} as NonNullable<Budget["dark"]>;
const none = (kind: Budget["kind"], dark: boolean): Part => ({ kind, counterLines: {}, dark: dark ? darkSection : null });

describe("noSourceLineText", () => {
  it("says why no line sources current: a sink-drive counter, every output decoded dark, or no diode at all", () => {
    expect(noSourceLineText(none("low-side-switch", true), "sink")).toBe(
      "Counter lines: none sources current (a sink-drive counter has only its active-low lines nS<k>; what each sinks is in the ghost check)",
    );
    expect(noSourceLineText(none("low-side-switch", true), "complementary")).toBe(
      "Counter lines: none sources current (every output is decoded dark: the diodes meet only the active-low lines nS<k>; what each sinks is in the ghost check)",
    );
    expect(noSourceLineText(none("current-sink", false), "source")).toBe(
      "Counter lines: none sources current (no diode meets a counter line: every segment is lit in every state or in none)",
    );
  });

  it("says nothing where there are lines to list, or where a high-side switch lists its active-low lines", () => {
    const line = { sourceCurrentA: 0, sourceState: null, lineV: 5, sagV: 0, sinkCurrentA: 0, sinkState: null, ratedA: 0.005 };
    expect(noSourceLineText({ kind: "low-side-switch", counterLines: { S0: line }, dark: null }, "complementary")).toBeNull();
    expect(noSourceLineText(none("high-side-switch", false), "sink")).toBeNull();
  });
});
