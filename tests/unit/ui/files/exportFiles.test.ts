import { mkdtemp, readFile, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { main } from "../../../../src/cli/main.ts";
import { nodeIo } from "../../../../src/cli/nodeIo.ts";
import { solveBudget } from "../../../../src/core/budget/budget.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { parseProject } from "../../../../src/core/project/projectSchema.ts";
import { synthesize, synthSettings } from "../../../../src/core/synth/synthesize.ts";
import { registerNodeWindow } from "../../../../src/render/nodeWindow.ts";
import { exportFiles, type ExportKind } from "../../../../src/ui/files/exportFiles.ts";
import { withMatrix } from "../../../../src/ui/workers/liveResult.ts";
import { exampleText } from "../../../support/projects.ts";
import { storedZipEntries } from "../../../support/zipRead.ts";

describe("the web app's Export", () => {
  it("offers, kind by kind, exactly the files the command's export writes", async () => {
    const dir = await mkdtemp(join(tmpdir(), "diodeloom-web-export-"));
    try {
      const file = new URL("../../../../public/examples/turntable-position.json", import.meta.url).pathname;
      const quiet = { ...nodeIo, out: () => undefined, err: () => undefined };
      expect(await main(["export", file, "--out", dir, "--fast"], quiet)).toBe(0);

      const parsed = parseProject(exampleText("turntable-position"));
      if (!parsed.ok) throw new Error("the example does not parse");
      const project = parsed.value;
      const spec = compileSpec(project);
      const settings = synthSettings(project, { mode: "fast" });
      const m = await synthesize(spec, settings);
      if (!m.ok) throw new Error(m.error.message);
      const budget = solveBudget(project, spec, m.value);
      registerNodeWindow();
      const kinds: ExportKind[] = ["svg", "wiring", "wiring-page", "bom", "netlists", "budget", "project"];
      const offered = new Map<string, string>();
      for (const kind of kinds) {
        for (const f of exportFiles(withMatrix(project, spec, settings, m.value), kind, "a4", budget)) {
          if (typeof f.content === "string") offered.set(f.name, f.content);
          else for (const e of storedZipEntries(f.content)) offered.set(e.name, e.text);
        }
      }
      expect(offered.size).toBe(6 + spec.states.length);
      for (const [name, text] of offered) expect(await readFile(join(dir, ...name.split("/")), "utf8"), name).toBe(text);
    } finally {
      await rm(dir, { recursive: true, force: true });
    }
  });
});
