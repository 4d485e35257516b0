/**
 * `npm run bench`: speed and memory figures of this machine, printed as tables. Not a
 * test: nothing here passes or fails; the targets are printed beside the
 * figures so a reader can compare.
 */
import { availableParallelism, cpus, totalmem } from "node:os";
import { runBudgetBench, runLargestBudgetBench } from "./budgetBench.ts";
import { runStartupBench } from "./startupBench.ts";
import { runSynthBench } from "./synthBench.ts";
import { runCodedBench } from "./codedBench.ts";
import { runMilpBench } from "./milpBench.ts";
import { runMemoryBench } from "./memoryBench.ts";

const log = (line: string): void => void process.stdout.write(line + "\n");

log(
  `diodeloom bench: node ${process.version}, ${availableParallelism()} cores (${cpus()[0]?.model ?? "unknown cpu"}), ${(totalmem() / 2 ** 30).toFixed(0)} GiB`,
);
log("");
await runStartupBench(log);
log("");
await runSynthBench(log);
log("");
await runMilpBench(log);
log("");
await runCodedBench(log);
log("");
await runBudgetBench(log);
log("");
await runLargestBudgetBench(log);
log("");
await runMemoryBench(log);
