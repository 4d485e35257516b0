/**
 * The web app's Export, run in Node as the page runs it: the example's
 * heuristic matrix (the live result the page shows first), its budget
 * solved as the analysis worker solves it, and every file of every Export
 * kind, unpacked from its ZIP where there are several.
 */
import type { TrimMode } from "../../src/core/budget/segmentDesign.ts";
import { solveBudget } from "../../src/core/budget/budget.ts";
import { compileSpec } from "../../src/core/spec/decodeSpec.ts";
import { parseProject } from "../../src/core/project/projectSchema.ts";
import { synthesize, synthSettings } from "../../src/core/synth/synthesize.ts";
import { registerNodeWindow } from "../../src/render/nodeWindow.ts";
import { PAPER_KINDS } from "../../src/render/papers.ts";
import { exportFiles } from "../../src/ui/files/exportFiles.ts";
import { withMatrix } from "../../src/ui/workers/liveResult.ts";
import { exampleText } from "./projects.ts";
import { storedZipEntries } from "./zipRead.ts";

/** Every file the Export menu offers for an example, text by name (`spice/S0.cir`...). */
export async function webExport(name: string, trim: TrimMode = "auto"): Promise<Map<string, string>> {
  const parsed = parseProject(exampleText(name));
  if (!parsed.ok) throw new Error(`example ${name} does not parse`);
  const project = parsed.value;
  const spec = compileSpec(project);
  const settings = synthSettings(project, { mode: "fast" });
  const m = await synthesize(spec, settings);
  if (!m.ok) throw new Error(m.error.message);
  const live = withMatrix(project, spec, settings, m.value);
  // As analysisWorker.ts solves it.
  const budget = solveBudget(project, spec, m.value, { trim });
  registerNodeWindow();
  const offered = new Map<string, string>();
  for (const kind of PAPER_KINDS) {
    for (const f of exportFiles(live, kind, { paper: "a4" }, budget)) {
      if (typeof f.content === "string") offered.set(f.name, f.content);
      else for (const e of storedZipEntries(f.content)) offered.set(e.name, e.text);
    }
  }
  return offered;
}
