/**
 * The readable report of `synth` for a coded counter: the gates, the stage
 * lines used straight, what feeds every output, the two-rank decoder beside
 * the chosen one, and what the unused codes show.
 */
import type { CodedSynthesis } from "../core/logic/synthesizeCoded.ts";
import { powerUpTable, powerUpText } from "../core/logic/powerUp.ts";
import type { DiodeMatrix } from "../core/matrix/matrix.ts";
import type { Project } from "../core/project/project.ts";
import { literalHigh, literalOf } from "../core/spec/counterCode.ts";
import type { DecodeSpec } from "../core/spec/decodeSpec.ts";

const CODE_TEXT = {
  johnson: "Johnson (twisted-ring)",
  binary: "binary",
  custom: "custom-coded",
} as const;

/** The decoder's resistor and gate counts: one pull-up per gate. */
export function decoderParts(m: DiodeMatrix): { readonly diodes: number; readonly gates: number; readonly pullUps: number } {
  return { diodes: m.count, gates: m.gates.length, pullUps: m.gates.length };
}

/** The report of `synth` for a coded counter. */
export function describeDecoder(project: Project, spec: DecodeSpec, coded: CodedSynthesis): string {
  const m = coded.matrix;
  const two = coded.twoLevel;
  const kind = spec.counter.kind === "one-hot" ? "one-hot" : CODE_TEXT[spec.counter.kind];
  const L: string[] = [project.title];
  L.push(
    `${spec.states.length} states on a ${kind} counter of ${spec.counter.stages} stage(s); ${spec.positions} position(s) of ${spec.cell.kind}: ` +
      `${spec.outputs.length} outputs driven, ${spec.tiedOn.length} tied on, ${spec.neverLit.length} never lit`,
  );
  L.push(structureLine(coded));
  L.push(boundLine(coded));
  if (m.deadlineHit) {
    L.push(
      "The time limit ran out before the optimizer's work budget did (a busy machine?): another run may give a different decoder or bound.",
    );
  }
  L.push("");

  const high = (code: string, inputs: readonly string[]): boolean => inputs.every((i) => literalHigh(literalOf(i)!, code));
  const drives = new Map<string, string[]>();
  for (const d of m.diodes) if (!m.lines.includes(d.to)) drives.set(d.from, [...(drives.get(d.from) ?? []), d.to]);
  const sources = [
    ...m.gates.map((g) => ({ name: g.ref, inputs: g.inputs })),
    ...m.lines.filter((l) => drives.has(l)).map((l) => ({ name: l, inputs: [l] })),
  ];
  const textW = Math.max(4, ...spec.texts.map((t) => t.length + 2));
  const codeW = Math.max(4, spec.counter.stages);
  L.push(`${"State".padEnd(6)} ${"Code".padEnd(codeW)} ${"Text".padEnd(textW)} High terms that drive`);
  spec.states.forEach((s, k) => {
    const code = spec.counter.codes[k] as string;
    const on = sources.filter((src) => high(code, src.inputs)).map((src) => src.name);
    L.push(`${s.padEnd(6)} ${code.padEnd(codeW)} ${`"${spec.texts[k]}"`.padEnd(textW)} ${on.join(" ") || "-"}`);
  });

  if (m.gates.length > 0) {
    L.push("", "AND gates (a pull-up on the gate node; one diode from the node to each input line)");
    const w = Math.max(...m.gates.map((g) => g.inputs.join("·").length));
    for (const g of m.gates) {
      const states = spec.states.filter((_, k) => high(spec.counter.codes[k] as string, g.inputs));
      L.push(
        `  ${g.ref.padEnd(4)} ${g.inputs.join("·").padEnd(w)} -> ${(drives.get(g.ref) ?? []).join(" ")}   (high in ${states.join(" ")})`,
      );
    }
  }
  const direct = m.lines.filter((l) => drives.has(l));
  if (direct.length > 0) {
    L.push("", "Stage lines used straight (one OR diode each)");
    for (const l of direct) L.push(`  ${l.padEnd(5)} -> ${(drives.get(l) ?? []).join(" ")}`);
  }
  if (m.buses.length > 0) {
    L.push("", "Bus nodes (shared OR nodes: terms in -> outputs out)");
    for (const b of m.buses) {
      const ins = m.diodes.filter((d) => d.to === b).map((d) => d.from);
      L.push(`  ${b.padEnd(4)} ${ins.join(" ")} -> ${(drives.get(b) ?? []).join(" ")}`);
    }
  }
  L.push("", `${"Output".padEnd(7)} Fed by`);
  for (const o of spec.outputs)
    L.push(
      `${o.padEnd(7)} ${m.diodes
        .filter((d) => d.to === o)
        .map((d) => d.from)
        .join(" ")}`,
    );
  if (spec.tiedOn.length > 0) L.push(`Tied on (lit in every state, no diodes): ${spec.tiedOn.join(" ")}`);
  if (spec.neverLit.length > 0) L.push(`Never lit (no driver): ${spec.neverLit.join(" ")}`);

  const rank = coded.twoRank;
  L.push("", "Against decoding in two ranks (one AND gate per state, then the ring-counter matrix on the state lines)");
  L.push(`  ${"".padEnd(10)} ${"diodes".padStart(6)} ${"resistors".padStart(9)} ${"gates".padStart(5)}`);
  const row = (name: string, x: DiodeMatrix, note: string): string => {
    const parts = decoderParts(x);
    return `  ${name.padEnd(10)} ${String(parts.diodes).padStart(6)} ${String(parts.pullUps).padStart(9)} ${String(parts.gates).padStart(5)}  ${note}`;
  };
  L.push(row("this", m, coded.structure === "two-level" ? "two-level" : "with shared OR nodes"));
  if (coded.structure !== "two-level") L.push(row("two-level", two.matrix, "two-level"));
  L.push(row("two-rank", rank.matrix, `${rank.gateDiodes} in the gates, ${rank.matrixDiodes} in the matrix (${rank.lineMatrix.method})`));
  L.push("  (resistors: one pull-up per gate; the output drivers are the same for all)");

  const table = powerUpTable(spec, m, project.glyphs);
  L.push("", `Codes the counter never reaches (power-up or a fault): ${table.unusedCodes}`);
  if (!table.listed) L.push(`  not listed: ${spec.counter.stages} stages give too many codes to list`);
  for (const e of table.entries) L.push(`  ${powerUpText(e)}`);

  L.push(
    "",
    `Totals: ${m.count} diodes, ${m.gates.length} AND gates (${m.gates.length} pull-up resistors); two ranks would take ${rank.matrix.count} diodes`,
  );
  return L.join("\n") + "\n";
}

function structureLine(coded: CodedSynthesis): string {
  const m = coded.matrix;
  const method = { direct: "one gate per state, one OR diode per lit cell", heuristic: "heuristic", exact: "exact optimizer (HiGHS)" }[
    m.method
  ];
  const shape =
    coded.structure === "two-level"
      ? "two-level logic: every output an OR of stage lines and AND gates, one OR diode on every path"
      : `AND gates, then shared OR nodes (${coded.structure === "merged" ? "states that light the same outputs merged" : "one gate per state"}), longest path ${m.longestPath} OR diodes`;
  return `Decoder: ${shape}; method ${method}; verified for every used code; depth limit ${m.depthLimit} (${m.policy})`;
}

function boundLine(coded: CodedSynthesis): string {
  const two = coded.twoLevel;
  const tm = two.matrix;
  const gates = two.gatesProven ? `${two.gates} gates, the fewest at that count` : `${two.gates} gates`;
  const family = two.complete ? `all ${two.terms} candidate terms` : `${two.terms} candidate terms (the family was cut short)`;
  const proof =
    tm.optimal && two.end !== "heuristic"
      ? `proven minimum of two-level logic: ${tm.count} diodes, ${gates} (over ${family})`
      : `two-level: ${tm.count} diodes, ${two.gates} gates; lower bound ${two.lowerBound}, gap ${tm.count - two.lowerBound}`;
  if (coded.structure === "two-level") return `Bound: ${proof}`;
  return `Bound: ${proof}; shared OR nodes save ${tm.count - coded.matrix.count} more (no bound is claimed for them)`;
}
