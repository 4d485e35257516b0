import { compareGlyphStyles, COMPARE_SCHEMA, type GlyphStyleRow } from "../../core/compare/glyphStyles.ts";
import type { Command } from "../command.ts";
import { EXIT } from "../io.ts";
import { DECODER_OPTION, DECODER_USAGE, loadProject } from "../loadProject.ts";
import { reportFailure, settingsFromArgs } from "../synthOptions.ts";
import { decoderRows, type DecoderRow } from "../../core/compare/decoderRows.ts";
import { comparePolarities, type PolarityRow } from "../../core/compare/polarityRows.ts";
import { synthesizeCoded } from "../../core/logic/synthesizeCoded.ts";
import { compileSpec } from "../../core/spec/decodeSpec.ts";
import { synthesize } from "../../core/synth/synthesize.ts";

const USAGE = `compare FILE [--json] [--fast] [--polarity] [--time-limit MS] ${DECODER_USAGE}`;

export const compareCommand: Command = {
  name: "compare",
  usage: USAGE,
  options: {
    json: { help: "print diodeloom/compare@1 JSON" },
    ...DECODER_OPTION,
    fast: { help: "the heuristic only (no exact optimizer, no bounds)" },
    polarity: { help: "also decode every glyph style lit, dark and either, on complementary counter lines (one-hot counters)" },
    "time-limit": { value: true, meta: "MS", help: "time limit for all combinations together, milliseconds" },
  },
  async run(args, io) {
    const project = await loadProject(args, io, USAGE, "compares the glyph styles of one decoder");
    if (!project) return EXIT.input;
    const settings = settingsFromArgs(project, args, io);
    if (!settings) return EXIT.input;
    const result = await compareGlyphStyles(project, { settings });
    if (!result.ok) return reportFailure(result.error, io);
    const rows = result.value;
    // A coded counter: its own glyphs decoded in two levels and in two ranks, side by side.
    let decoders: DecoderRow[] | undefined;
    if (project.counter.code !== "one-hot") {
      const coded = await synthesizeCoded(compileSpec(project), settings, { oneHot: synthesize });
      if (!coded.ok) return reportFailure(coded.error, io);
      decoders = decoderRows(coded.value);
    }
    // Lit, dark and either for each glyph style, on complementary lines.
    let polarity: PolarityRow[] | undefined;
    if (args.flags.has("polarity") && project.counter.code === "one-hot") {
      const p = await comparePolarities(project, { settings });
      if (!p.ok) return reportFailure(p.error, io);
      polarity = p.value;
    }
    if (args.flags.has("json")) {
      io.out(
        JSON.stringify({ schema: COMPARE_SCHEMA, rows, ...(decoders ? { decoders } : {}), ...(polarity ? { polarity } : {}) }, null, 2) +
          "\n",
      );
      return EXIT.ok;
    }
    io.out(describeRows(project.title, rows, settings.policy, settings.depthLimit));
    if (decoders) io.out(describeDecoders(decoders));
    if (polarity) io.out(describePolarity(polarity, project.synthesis.darkInput));
    return EXIT.ok;
  },
};

/** The readable report: one block per combination, best first, with the glyphs drawn. */
export function describeRows(title: string, rows: readonly GlyphStyleRow[], policy: string, depthLimit: number): string {
  const lines = [title, `Glyph styles by smallest verified matrix (depth limit ${depthLimit}, ${policy})`, ""];
  if (rows.length === 1 && Object.keys(rows[0]?.glyphs ?? {}).length === 0) {
    lines.push("The project shows no character with a built-in variant (6, 7, 9); nothing to compare.");
  }
  rows.forEach((r, i) => {
    const chars = Object.keys(r.glyphs);
    const bound = r.optimal ? "proven minimum" : `${r.status}; ${r.lowerBound !== null ? `lower bound ${r.lowerBound}` : "no bound"}`;
    lines.push(`#${i + 1}  ${r.count} diodes (${bound})  ${chars.map((c) => `${c}=${r.glyphs[c]}`).join(" ")}`);
    if (chars.length > 0) {
      const art = chars.map((c) => drawSeg7(r.glyphs[c] ?? ""));
      for (let line = 0; line < 3; line++) lines.push("    " + art.map((a) => a[line]).join("   "));
    }
    lines.push("");
  });
  return lines.join("\n");
}

/** The decode-polarity rows: per glyph style, lit, dark and either with their diodes, bound and resistors. */
export function describePolarity(rows: readonly PolarityRow[], darkInput: string): string {
  const lines = [
    `\nDecode polarity on complementary counter lines (S<k> and nS<k>); dark-decoded outputs with ${darkInput === "divider" ? "a divider each" : "level-shift diodes"}`,
    `  ${"glyphs".padEnd(24)} ${"decode".padEnd(7)} ${"diodes".padStart(6)} ${"matrix".padStart(6)} ${"shift".padStart(5)} ${"resistors".padStart(9)} ${"dark".padStart(4)}  bound`,
  ];
  for (const r of rows) {
    const glyphs = Object.entries(r.glyphs)
      .map(([c, g]) => `${c}=${g}`)
      .join(" ");
    const label = `  ${(glyphs || "(as shown)").padEnd(24)} ${r.decode.padEnd(7)}`;
    if (r.refused !== null) {
      lines.push(`${label} no circuit: ${r.refused}`);
      continue;
    }
    const bound = r.optimal
      ? "proven minimum"
      : r.lowerBound !== null
        ? `${r.status}; lower bound ${r.lowerBound}`
        : `${r.status}; no bound`;
    lines.push(
      `${label} ${String(r.diodes).padStart(6)} ${String(r.matrixDiodes).padStart(6)} ${String(r.inputDiodes).padStart(5)} ${String(r.resistors).padStart(9)} ${String(r.darkOutputs).padStart(4)}  ${bound}`,
    );
  }
  lines.push(
    "  (diodes = matrix + level-shift; resistors: a pull-down (a high-side switch's line pull-up) per lit-decoded output, a pull-up and a bleed or divider per dark-decoded one; the drivers' own are the same in every row)",
    "",
  );
  return lines.join("\n");
}

/** The decoders of a coded counter, one line each: diodes, resistors, gates. */
export function describeDecoders(rows: readonly DecoderRow[]): string {
  const name = {
    "two-level": "two-level logic",
    "two-rank": "two ranks (a gate per state, then the matrix)",
    shared: "gates and shared OR nodes",
  };
  const lines = [
    "Decoders for the project's own glyphs",
    `  ${"".padEnd(46)} ${"diodes".padStart(6)} ${"resistors".padStart(9)} ${"gates".padStart(5)}`,
  ];
  for (const r of rows) {
    const bound = r.optimal ? "  proven minimum" : r.lowerBound !== null ? `  lower bound ${r.lowerBound}` : "";
    lines.push(
      `${r.chosen ? "* " : "  "}${name[r.decoder].padEnd(46)} ${String(r.diodes).padStart(6)} ${String(r.resistors).padStart(9)} ${String(r.gates).padStart(5)}${bound}`,
    );
  }
  lines.push("  (* the decoder synth builds; resistors: one pull-up per gate, the output drivers are the same for all)", "");
  return lines.join("\n");
}

/** Three text lines drawing a seven-segment glyph from its lit-segment string. */
export function drawSeg7(lit: string): [string, string, string] {
  const on = (s: string): boolean => lit.includes(s);
  return [
    ` ${on("a") ? "_" : " "} `,
    `${on("f") ? "|" : " "}${on("g") ? "_" : " "}${on("b") ? "|" : " "}`,
    `${on("e") ? "|" : " "}${on("d") ? "_" : " "}${on("c") ? "|" : " "}`,
  ];
}
