import { mkdtemp, readFile, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { main } from "../../../../src/cli/main.ts";
import { nodeIo } from "../../../../src/cli/nodeIo.ts";
import { example } from "../../../support/projects.ts";
import { webExport } from "../../../support/webExport.ts";

describe("the web app's Export", () => {
  it("offers, kind by kind, exactly the files the command's export writes", async () => {
    const dir = await mkdtemp(join(tmpdir(), "diodeloom-web-export-"));
    try {
      const file = new URL("../../../../public/examples/turntable-position.json", import.meta.url).pathname;
      const quiet = { ...nodeIo, out: () => undefined, err: () => undefined };
      expect(await main(["export", file, "--out", dir, "--fast"], quiet)).toBe(0);
      const offered = await webExport("turntable-position");
      // matrix, driver, wiring (2), budget, BOM, project, and a deck per state.
      expect(offered.size).toBe(7 + example("turntable-position").counter.states);
      for (const [name, text] of offered) expect(await readFile(join(dir, ...name.split("/")), "utf8"), name).toBe(text);
    } finally {
      await rm(dir, { recursive: true, force: true });
    }
  });
});
