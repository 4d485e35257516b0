import { formatProblems } from "../core/result/result.ts";
import { parseInstrumentBytes, type Instrument, type InstrumentDecoder } from "../core/project/instrument.ts";
import type { Project } from "../core/project/project.ts";
import { decoderRefPrefix } from "../core/matrix/designators.ts";
import { quoteText } from "../core/project/valueText.ts";
import { shownArg, type OptionSpec, type ParsedArgs } from "./args.ts";
import type { CliIo } from "./io.ts";

/** `--decoder NAME`: one decoder of an instrument file, for every command. */
export const DECODER_OPTION: Readonly<Record<string, OptionSpec>> = {
  decoder: { value: true, meta: "NAME", help: "of an instrument (a file with decoders), only the decoder of that name" },
};

export const DECODER_USAGE = "[--decoder NAME]";

/** A project file read as an instrument, with `--decoder` applied. */
export interface LoadedInstrument {
  readonly instrument: Instrument;
  /** Per decoder of `instrument`, its designator prefix in the whole file (`decoderRefPrefix`; "" for a single decoder). */
  readonly refPrefixes: readonly string[];
}

/**
 * Reads and validates the one project file a command names, as an
 * instrument (a single-decoder file gives one decoder), and applies
 * `--decoder`: the instrument then holds that decoder only, and counts as
 * a single project (`single` true), so a command prints it as it prints a
 * single-decoder file, but its parts keep the designators they have in the
 * whole instrument. On any problem it prints the messages (prefixed with
 * the file name) and returns undefined; the caller exits with code 2.
 */
export async function loadInstrument(args: ParsedArgs, io: CliIo, usage: string): Promise<LoadedInstrument | undefined> {
  const file = args.positional[0];
  if (file === undefined || args.positional.length > 1) {
    io.err(`usage: diodeloom ${usage}\n`);
    return undefined;
  }
  const name = shownArg(file, 400);
  const read = await io.readFile(file);
  if (!read.ok) {
    io.err(`${name}: ${read.message}\n`);
    return undefined;
  }
  const parsed = parseInstrumentBytes(read.bytes);
  if (!parsed.ok) {
    io.err(
      formatProblems(parsed.error)
        .split("\n")
        .map((l) => `${name}: ${l}`)
        .join("\n") + "\n",
    );
    return undefined;
  }
  const all = parsed.value.decoders;
  const refPrefixes = all.map((_, i) => decoderRefPrefix(i, all.length));
  const wanted = args.values.get("decoder");
  if (wanted === undefined) return { instrument: parsed.value, refPrefixes };
  const index = all.findIndex((d) => d.name === wanted);
  const chosen = all[index];
  if (!chosen) {
    io.err(`--decoder: got ${quoteText(wanted)}; ${name} holds ${decoderList(all)}\n`);
    return undefined;
  }
  return { instrument: { title: parsed.value.title, decoders: [chosen], single: true }, refPrefixes: [refPrefixes[index] ?? ""] };
}

/** The one decoder a command works on, with its designator prefix. */
export interface LoadedDecoder {
  readonly project: Project;
  readonly refPrefix: string;
}

/**
 * Reads the one decoder a command works on: a single-decoder file, a
 * one-decoder instrument, or the decoder `--decoder` names. An instrument
 * of several decoders without `--decoder` is refused with a message that
 * names them (`what` says what the command does with one decoder).
 */
export async function loadDecoder(
  args: ParsedArgs,
  io: CliIo,
  usage: string,
  what = "works on one decoder",
): Promise<LoadedDecoder | undefined> {
  const loaded = await loadInstrument(args, io, usage);
  if (!loaded) return undefined;
  const { instrument } = loaded;
  const [first] = instrument.decoders;
  if (instrument.decoders.length === 1 && first) return { project: first.project, refPrefix: loaded.refPrefixes[0] ?? "" };
  const file = shownArg(args.positional[0] ?? "", 400);
  io.err(
    `${file}: an instrument of ${instrument.decoders.length} decoders (${instrument.decoders.map((d) => quoteText(d.name)).join(", ")}); ` +
      `this command ${what}: give --decoder NAME\n`,
  );
  return undefined;
}

/** `the decoders "a", "b"` or `one decoder, "main"`, for messages. */
export function decoderList(decoders: readonly InstrumentDecoder[]): string {
  const names = decoders.map((d) => quoteText(d.name)).join(", ");
  return decoders.length === 1 ? `one decoder, ${names}` : `the decoders ${names}`;
}

/** `loadDecoder`'s project alone, for a command that names no parts. */
export async function loadProject(args: ParsedArgs, io: CliIo, usage: string, what?: string): Promise<Project | undefined> {
  return (await loadDecoder(args, io, usage, what))?.project;
}

/** The io of one decoder of an instrument: its messages name the decoder. */
export function decoderIo(io: CliIo, name: string): CliIo {
  return { ...io, err: (text) => io.err(text.replace(/^(?=.)/gm, `decoder ${quoteText(name)}: `)) };
}
