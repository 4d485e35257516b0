import { spiceNetlist } from "../../core/papers/netlist.ts";
import type { Command } from "../command.ts";
import { designFor, DESIGN_OPTIONS, DESIGN_USAGE, loadForDesign } from "../designOptions.ts";
import { DECODER_OPTION, DECODER_USAGE } from "../loadProject.ts";
import { EXIT } from "../io.ts";
import { quoteText } from "../../core/project/valueText.ts";
import { SYNTH_OPTIONS, SYNTH_USAGE } from "../synthOptions.ts";

const USAGE = `netlist FILE --state K ${SYNTH_USAGE} ${DESIGN_USAGE} ${DECODER_USAGE}`;

export const netlistCommand: Command = {
  name: "netlist",
  usage: USAGE,
  options: {
    state: { value: true, meta: "K", help: "the active state: its number 0..N-1 or its name S0..S(N-1)" },
    ...DECODER_OPTION,
    ...SYNTH_OPTIONS,
    ...DESIGN_OPTIONS,
  },
  async run(args, io) {
    const raw = args.values.get("state");
    if (raw === undefined) {
      io.err(`--state is required (the active state, e.g. --state 0)\nusage: diodeloom ${USAGE}\n`);
      return EXIT.input;
    }
    const m = /^S?(\d+)$/i.exec(raw);
    const k = m ? Number(m[1]) : NaN;
    const done = await loadForDesign(
      args,
      io,
      USAGE,
      (project) => {
        const n = project.counter.states;
        if (Number.isInteger(k) && k >= 0 && k < n) return undefined;
        return `--state: got ${quoteText(raw)}; must be a state number from 0 to ${n - 1} or a name S0..S${n - 1}`;
      },
      "prints the circuit of one decoder's state",
    );
    if (typeof done === "number") return done;
    const { project, spec, matrix, design } = done;
    io.out(spiceNetlist(project, spec, matrix, k, designFor(project, spec, matrix, design, done.timeLimitMs)));
    return EXIT.ok;
  },
};
