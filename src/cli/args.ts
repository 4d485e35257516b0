/**
 * A small, strict argument parser: every command declares its options, and
 * anything undeclared is a usage error that names the option.
 *
 * An option may have an older spelling that is still accepted
 * (`--max-depth` for `--depth-limit`); its value is stored under the
 * documented name, and `spelling` remembers how it was typed so that a
 * message can use the person's own words.
 */
import { hasUnsafeText, quoteText } from "../core/project/valueText.ts";

export interface OptionSpec {
  /** Takes a value (`--out DIR`) rather than being a flag (`--json`). */
  readonly value?: boolean;
  readonly help: string;
  /** Placeholder shown in help, e.g. `MS`. */
  readonly meta?: string;
  /** This is an older spelling of that option (its name without `--`), still accepted. */
  readonly olderSpellingOf?: string;
}

export interface ParsedArgs {
  readonly positional: readonly string[];
  readonly flags: ReadonlySet<string>;
  /** Option values by the option's documented name. */
  readonly values: ReadonlyMap<string, string>;
  /** How each value option was typed (`--max-depth`), by its documented name. */
  readonly spelling: ReadonlyMap<string, string>;
}

/**
 * An argument as a message shows it: as typed when it is plain, quoted (and
 * cut after `maxChars`) when it holds control characters or is longer.
 */
export function shownArg(text: string, maxChars = 40): string {
  return hasUnsafeText(text) || [...text].length > maxChars ? quoteText(text, maxChars) : text;
}

export function parseArgs(
  argv: readonly string[],
  options: Readonly<Record<string, OptionSpec>>,
): { ok: true; args: ParsedArgs } | { ok: false; message: string } {
  const positional: string[] = [];
  const flags = new Set<string>();
  const values = new Map<string, string>();
  const spelling = new Map<string, string>();
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i] as string;
    if (a === "--") {
      positional.push(...argv.slice(i + 1));
      break;
    }
    if (a.startsWith("--")) {
      const eq = a.indexOf("=");
      const name = a.slice(2, eq < 0 ? undefined : eq);
      const spec = options[name];
      if (!spec) {
        const known = Object.entries(options)
          .filter(([, s]) => s.olderSpellingOf === undefined)
          .map(([k]) => `--${k}`)
          .join(", ");
        return { ok: false, message: `unknown option ${shownArg(`--${name}`)}${known ? ` (this command takes ${known})` : ""}` };
      }
      const canonical = spec.olderSpellingOf ?? name;
      if (spec.value) {
        const val = eq >= 0 ? a.slice(eq + 1) : argv[++i];
        if (val === undefined || val === "") return { ok: false, message: `--${name} needs a value (${spec.meta ?? "VALUE"})` };
        const earlier = spelling.get(canonical);
        if (earlier !== undefined) {
          const same = earlier === `--${name}` ? `${earlier} is given twice` : `${earlier} and --${name} are the same option`;
          return { ok: false, message: `${same}; give it once` };
        }
        values.set(canonical, val);
        spelling.set(canonical, `--${name}`);
      } else {
        if (eq >= 0) return { ok: false, message: `--${name} takes no value` };
        flags.add(canonical);
      }
    } else if (a.startsWith("-") && a.length > 1) {
      return { ok: false, message: `unknown option ${shownArg(a)}; options are spelled --name` };
    } else {
      positional.push(a);
    }
  }
  return { ok: true, args: { positional, flags, values, spelling } };
}

export function helpLines(options: Readonly<Record<string, OptionSpec>>): string[] {
  return Object.entries(options).map(([k, s]) => {
    const left = `  --${k}${s.value ? ` ${s.meta ?? "VALUE"}` : ""}`;
    const help = s.olderSpellingOf !== undefined ? `older spelling of --${s.olderSpellingOf}, still accepted` : s.help;
    return `${left.padEnd(24)} ${help}`;
  });
}
