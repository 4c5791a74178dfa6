// Command-line options: each command declares its options once (an OptionTable); the parser, the
// usage errors and the help text all come from that declaration.
import { EngineError } from "../engine";

/** What an option's value must be. */
export type OptionType =
  | { kind: "switch" }
  | { kind: "int"; min: number }
  | { kind: "number" }
  | { kind: "choice"; values: readonly string[] }
  | { kind: "pair" }
  | { kind: "text" }
  /** Checked by a function that returns the value to use or throws a usage error. */
  | { kind: "custom"; check: (v: string, name: string) => unknown };

/** One option of a command, as declared in the command's file. */
export interface OptionSpec {
  type: OptionType;
  /** The value's placeholder in usage lines, e.g. "H" for --horizon H. */
  value?: string;
  /** One line of help. */
  help: string;
  /** A value that works, used in messages ("e.g. --horizon 12") and help. */
  example?: string;
  /** The default, as shown in help. */
  default?: string;
  /** Set when the option must be given: what it is for (the error message says it). */
  required?: string;
}

/** A command's options by name (without the dashes), in the order help lists them. */
export type OptionTable = Record<string, OptionSpec>;

/** A switch option (no value). */
export function switchOption(help: string): OptionSpec {
  return { type: { kind: "switch" }, help };
}

/** The parsed command line of one command: positional arguments and checked option values. */
export class ParsedArgs {
  constructor(
    readonly positional: string[],
    private readonly raw: Map<string, string | true>,
    private readonly values: Map<string, unknown>,
    /** The command's arguments as typed (a worker thread parses them again). */
    readonly argv: string[] = [],
  ) {}

  /** Whether the option was given. */
  has(name: string): boolean {
    return this.raw.has(name);
  }

  /** The option's value as typed (undefined when not given). */
  text(name: string): string | undefined {
    const v = this.raw.get(name);
    return v === undefined || v === true ? undefined : v;
  }

  /** A whole-number option's value (checked against its declared minimum). */
  int(name: string): number | undefined {
    return this.values.get(name) as number | undefined;
  }

  /** A number option's value. */
  num(name: string): number | undefined {
    return this.values.get(name) as number | undefined;
  }

  /** A choice option's value, lower case and one of the declared values. */
  choice(name: string): string | undefined {
    return this.values.get(name) as string | undefined;
  }

  /** A custom option's checked value. */
  value<T>(name: string): T | undefined {
    return this.values.get(name) as T | undefined;
  }

  /** The options given, as typed ("--name value" pairs; a switch has the value ""), for a record of the settings. */
  given(): [string, string][] {
    return Array.from(this.raw.entries(), ([k, v]) => [`--${k}`, v === true ? "" : v]);
  }

  /** A pair option's two numbers. */
  pair(name: string): [number, number] | undefined {
    return this.values.get(name) as [number, number] | undefined;
  }
}

/** Thrown by the parser when the user asked for help; the caller prints the command's help. */
export class HelpRequest {
  constructor(readonly command: string) {}
}

/**
 * A usage error (exit 1): the message says what to type instead.
 * @example throw usageError("--horizon needs a value.")
 */
export function usageError(message: string): EngineError {
  return new EngineError("input", message);
}

/** "a", "a or b", "a, b or c". */
export function orList(xs: readonly string[]): string {
  return xs.length <= 1 ? xs.join("") : `${xs.slice(0, -1).join(", ")} or ${xs[xs.length - 1]}`;
}

function exampleOf(name: string, spec: OptionSpec): string {
  return spec.type.kind === "switch" ? `--${name}` : `--${name} ${spec.example ?? spec.value ?? "VALUE"}`;
}

/** Checks one option's value against its declared type; returns the typed value. */
function checkValue(name: string, spec: OptionSpec, v: string): unknown {
  const t = spec.type;
  switch (t.kind) {
    case "int": {
      const x = Number(v);
      if (v.trim() === "" || !Number.isInteger(x) || x < t.min) throw usageError(`--${name} must be a whole number of at least ${t.min}; got "${v}".`);
      return x;
    }
    case "number": {
      const x = Number(v);
      if (v.trim() === "" || !Number.isFinite(x)) throw usageError(`--${name} must be a number; got "${v}".`);
      return x;
    }
    case "choice": {
      const x = v.trim().toLowerCase();
      if (!t.values.includes(x)) throw usageError(`--${name} must be ${orList(t.values)}; got "${v}".`);
      return x;
    }
    case "pair": {
      const parts = v.split(",").map((x) => x.trim());
      const nums = parts.map(Number);
      if (parts.length !== 2 || parts.some((x) => x === "") || nums.some((x) => !Number.isFinite(x))) {
        throw usageError(`--${name} must be two numbers separated by a comma, e.g. ${exampleOf(name, spec)}; got "${v}".`);
      }
      return nums as [number, number];
    }
    case "custom":
      return t.check(v, name);
    default:
      return v;
  }
}

/**
 * Parses a command's arguments against its option table. Options are `--name value`,
 * `--name=value` or `--switch`; `--help` anywhere asks for the command's help (a HelpRequest is
 * thrown). Unknown options, missing or malformed values and missing required options are `input`
 * EngineErrors that name what works.
 * @example parseOptions("screen", ["a.csv", "--period", "12"], { period: { type: { kind: "int", min: 1 }, help: "" } }).int("period") // 12
 */
export function parseOptions(command: string, argv: string[], table: OptionTable): ParsedArgs {
  const positional: string[] = [];
  const raw = new Map<string, string | true>();
  if (argv.includes("--help")) throw new HelpRequest(command);
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a.startsWith("--")) {
      const eq = a.indexOf("=");
      const name = eq >= 0 ? a.slice(2, eq) : a.slice(2);
      const spec = Object.prototype.hasOwnProperty.call(table, name) ? table[name] : undefined;
      if (!spec) throw usageError(`Unknown option --${name}. Options here: ${Object.keys(table).map((k) => `--${k}`).join(", ") || "none"}.`);
      if (spec.type.kind === "switch") {
        if (eq >= 0) throw usageError(`--${name} takes no value.`);
        raw.set(name, true);
      } else {
        const v = eq >= 0 ? a.slice(eq + 1) : argv[++i];
        if (v === undefined || (eq < 0 && v.startsWith("--"))) throw usageError(`--${name} needs a value.`);
        raw.set(name, v);
      }
    } else if (a.startsWith("-") && a !== "-" && !/^-\d/.test(a)) {
      throw usageError(`Unknown option ${a}. Options start with two dashes, e.g. ${dashExample(a, argv[i + 1], table)}.`);
    } else positional.push(a);
  }
  const values = new Map<string, unknown>();
  for (const [name, spec] of Object.entries(table)) {
    const v = raw.get(name);
    if (v === undefined) {
      if (spec.required) throw usageError(`--${name} is required: ${spec.required}`);
      continue;
    }
    if (v !== true) values.set(name, checkValue(name, spec, v));
  }
  return new ParsedArgs(positional, raw, values, argv.slice());
}

/** "--horizon 3" for "-h 3": the option the single-dash name starts, with the value the user typed. */
function dashExample(a: string, next: string | undefined, table: OptionTable): string {
  const typed = a.replace(/^-+/, "").split("=")[0].toLowerCase();
  const names = Object.keys(table);
  const name = names.find((n) => typed !== "" && n.startsWith(typed)) ?? names.find((n) => table[n].type.kind !== "switch") ?? names[0];
  if (name === undefined) return "--horizon 12";
  const spec = table[name];
  if (spec.type.kind === "switch") return `--${name}`;
  const inline = a.includes("=") ? a.slice(a.indexOf("=") + 1) : undefined;
  const value = inline ?? (next !== undefined && !next.startsWith("-") ? next : undefined) ?? spec.example ?? spec.value ?? "VALUE";
  return `--${name} ${value}`;
}

/** The usage fragment of one option: "--horizon H", "[--period N]", "[--json]". */
export function optionUsage(name: string, spec: OptionSpec): string {
  const s = spec.type.kind === "switch" ? `--${name}` : `--${name} ${spec.value ?? "VALUE"}`;
  return spec.required ? s : `[${s}]`;
}
