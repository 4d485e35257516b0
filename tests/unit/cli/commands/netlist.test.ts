import { describe, expect, it } from "vitest";
import { main } from "../../../../src/cli/main.ts";
import { recordingIo } from "../../../support/recordingIo.ts";
import { ONE_SEVEN_EIGHT_TEXT } from "../../../support/projects.ts";

const PROJECT = ONE_SEVEN_EIGHT_TEXT;

describe("netlist command", () => {
  it("prints the deck of the state asked for, by number or name", async () => {
    for (const state of ["2", "S2", "s2"]) {
      const io = recordingIo({ "p.json": PROJECT });
      expect(await main(["netlist", "p.json", "--state", state, "--direct"], io)).toBe(0);
      const deck = io.stdout.join("");
      expect(deck.split("\n")[0]).toBe("* One seven: state S2 active");
      expect(deck).toMatch(/^VS2 s2_v 0 DC 2\.4$/m);
      expect(deck).toMatch(/^\.op\n\.end\n$/m);
    }
  });

  it("needs --state, inside the counter", async () => {
    const none = recordingIo({ "p.json": PROJECT });
    expect(await main(["netlist", "p.json"], none)).toBe(2);
    expect(none.stderr.join("")).toMatch(/--state is required/);
    for (const bad of ["3", "-1", "x", "S9"]) {
      const io = recordingIo({ "p.json": PROJECT });
      expect(await main(["netlist", "p.json", "--state", bad], io)).toBe(2);
      expect(io.stderr.join("")).toMatch(/from 0 to 2/);
    }
  });
});
