/**
 * Debian's chromium driven by playwright-core, for every browser test. The
 * flags keep it off the network (this machine has none) and out of the
 * way of a desktop; launch() makes a fresh profile itself.
 */
import { execFileSync } from "node:child_process";
import { chromium, type Browser } from "playwright-core";

const CHROMIUM_ARGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
];

/** Starts chromium; fails loudly (never skips) when it is not installed. */
export async function launchChromium(): Promise<Browser> {
  let executablePath: string;
  try {
    executablePath = execFileSync("sh", ["-c", "command -v chromium"], { encoding: "utf8" }).trim();
  } catch {
    throw new Error("chromium is not installed (apt-get install chromium); the browser tests need it");
  }
  return chromium.launch({ executablePath, args: CHROMIUM_ARGS });
}
