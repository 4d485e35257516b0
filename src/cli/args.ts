/**
 * A small, strict argument parser: every command declares its options, and
 * anything undeclared is a usage error that names the option.
 */

export interface OptionSpec {
  /** Takes a value (`--out DIR`) rather than being a flag (`--json`). */
  readonly value?: boolean;
  readonly help: string;
  /** Placeholder shown in help, e.g. `MS`. */
  readonly meta?: string;
}

export interface ParsedArgs {
  readonly positional: readonly string[];
  readonly flags: ReadonlySet<string>;
  readonly values: ReadonlyMap<string, string>;
}

export function parseArgs(
  argv: readonly string[],
  options: Readonly<Record<string, OptionSpec>>,
): { ok: true; args: ParsedArgs } | { ok: false; message: string } {
  const positional: string[] = [];
  const flags = new Set<string>();
  const values = new Map<string, string>();
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
        const known = Object.keys(options)
          .map((k) => `--${k}`)
          .join(", ");
        return { ok: false, message: `unknown option --${name}${known ? ` (this command takes ${known})` : ""}` };
      }
      if (spec.value) {
        const val = eq >= 0 ? a.slice(eq + 1) : argv[++i];
        if (val === undefined || val === "") return { ok: false, message: `--${name} needs a value (${spec.meta ?? "VALUE"})` };
        values.set(name, val);
      } else {
        if (eq >= 0) return { ok: false, message: `--${name} takes no value` };
        flags.add(name);
      }
    } else if (a.startsWith("-") && a.length > 1) {
      return { ok: false, message: `unknown option ${a}; options are spelled --name` };
    } else {
      positional.push(a);
    }
  }
  return { ok: true, args: { positional, flags, values } };
}

/** Reads a whole-number option in a range, or says what is wrong. */
export function intOption(
  args: ParsedArgs,
  name: string,
  min: number,
  max: number,
): { ok: true; value: number | undefined } | { ok: false; message: string } {
  const raw = args.values.get(name);
  if (raw === undefined) return { ok: true, value: undefined };
  const n = Number(raw);
  if (!/^\d+$/.test(raw) || !Number.isInteger(n) || n < min || n > max) {
    return { ok: false, message: `--${name} must be a whole number from ${min} to ${max} (got "${raw}")` };
  }
  return { ok: true, value: n };
}

export function helpLines(options: Readonly<Record<string, OptionSpec>>): string[] {
  return Object.entries(options).map(([k, s]) => {
    const left = `  --${k}${s.value ? ` ${s.meta ?? "VALUE"}` : ""}`;
    return `${left.padEnd(24)} ${s.help}`;
  });
}
