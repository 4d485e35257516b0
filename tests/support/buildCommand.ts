/**
 * Vitest global set-up: builds the `diodeloom` command (dist/cli) from the
 * sources under test before any test runs, so the e2e tests that start
 * bin/diodeloom.mjs never run a build older than the code beside it.
 */
import { buildCli } from "../../scripts/buildCli.mjs";

export default async function setup(): Promise<void> {
  await buildCli();
}
