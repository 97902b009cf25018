/**
 * Command-line options of every sub-command, parsed with node:util parseArgs
 * (strict), and the checks that turn bad values into UsageError messages.
 */
import { parseArgs } from "node:util";
import { ORDERING_NAMES, type OrderingName } from "../ordering/index.js";
import { UsageError } from "./io.js";

export const ORDERINGS: readonly OrderingName[] = ORDERING_NAMES;
const ALIASES: Record<string, OrderingName> = { nd: "nested-dissection", md: "minimum-degree", rcm: "reverse-cuthill-mckee" };

/** The short alias of an ordering (nd, md, rcm), or its full name when it has none. */
export function shortOrderingName(o: OrderingName): string {
  return Object.keys(ALIASES).find((k) => ALIASES[k] === o) ?? o;
}

type Spec = Record<string, { type: "string" | "boolean"; short?: string }>;

const COMMON: Spec = {
  help: { type: "boolean", short: "h" },
  quiet: { type: "boolean", short: "q" },
  debug: { type: "boolean" },
};

/** The options each sub-command accepts (exported so a test can hold the help texts to them). */
export const SPECS: Record<string, Spec> = {
  solve: { ...COMMON, rhs: { type: "string" }, output: { type: "string", short: "o" }, ordering: { type: "string" }, method: { type: "string" }, json: { type: "boolean" }, seed: { type: "string" }, threads: { type: "string" }, kernels: { type: "string" } },
  analyze: { ...COMMON, ordering: { type: "string" }, method: { type: "string" }, json: { type: "boolean" }, compare: { type: "boolean" }, seed: { type: "string" }, threads: { type: "string" } },
  report: { ...COMMON, output: { type: "string", short: "o" }, ordering: { type: "string" }, seed: { type: "string" }, threads: { type: "string" } },
  generate: { ...COMMON, output: { type: "string", short: "o" }, stencil: { type: "string" }, contrast: { type: "string" }, degree: { type: "string" }, seed: { type: "string" } },
  demo: { ...COMMON, output: { type: "string", short: "o" }, size: { type: "string" } },
};

export type Parsed = { values: Record<string, string | boolean | undefined>; positionals: string[] };

/** Parse the arguments after the sub-command name. */
export function parseCommand(command: string, args: string[]): Parsed {
  try {
    const r = parseArgs({ args: negativeValuesJoined(args, SPECS[command]), options: SPECS[command], allowPositionals: true, strict: true });
    return { values: r.values as Parsed["values"], positionals: r.positionals };
  } catch (e) {
    const msg = e instanceof Error ? e.message.replace(/\. To specify a positional argument.*$/s, "") : String(e);
    throw new UsageError(`${command}: ${msg.replace(/^Unknown option/, "unknown option")}`);
  }
}

/**
 * `--seed -1` as `--seed=-1`: parseArgs takes a value that starts with a dash
 * for another option ("argument is ambiguous"), so a negative number after an
 * option that takes a value is joined to it, and the option's own check then
 * accepts it or names it.
 */
function negativeValuesJoined(args: string[], spec: Spec): string[] {
  const takes = new Map<string, string>();
  for (const [name, o] of Object.entries(spec)) {
    if (o.type !== "string") continue;
    takes.set(`--${name}`, name);
    if (o.short) takes.set(`-${o.short}`, name);
  }
  const out: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const name = takes.get(args[i]);
    if (name !== undefined && i + 1 < args.length && /^-(\d|\.\d|Infinity)/.test(args[i + 1])) out.push(`--${name}=${args[++i]}`);
    else out.push(args[i]);
  }
  return out;
}

/** The ordering named by --ordering (full names or nd, md, rcm). */
export function orderingOption(v: string | boolean | undefined, fallback: OrderingName = "nested-dissection"): OrderingName {
  if (v === undefined) return fallback;
  const name = String(v).toLowerCase();
  const o = ALIASES[name] ?? (ORDERINGS as readonly string[]).find((x) => x === name);
  if (!o) throw new UsageError(`--ordering: unknown ordering '${v}'; expected ${ORDERINGS.join(", ")} (or nd, md, rcm)`);
  return o;
}

/**
 * --ordering of solve and analyze: a named ordering, or undefined for "auto"
 * (the default), the library's own choice: the fewer flops of nested
 * dissection and minimum degree.
 */
export function orderingChoiceOption(v: string | boolean | undefined): OrderingName | undefined {
  if (v === undefined || String(v).toLowerCase() === "auto") return undefined;
  const name = String(v).toLowerCase();
  const o = ALIASES[name] ?? (ORDERINGS as readonly string[]).find((x) => x === name);
  if (!o) throw new UsageError(`--ordering: unknown ordering '${v}'; expected auto, ${ORDERINGS.join(", ")} (or nd, md, rcm)`);
  return o;
}

/** --method cholesky|ldlt. */
export function methodOption(v: string | boolean | undefined): "cholesky" | "ldlt" {
  if (v === undefined) return "cholesky";
  if (v === "cholesky" || v === "ldlt") return v;
  throw new UsageError(`--method: unknown method '${v}'; expected cholesky or ldlt`);
}

/** A numeric option within [lo, hi]; integer when asked. */
export function numberOption(name: string, v: string | boolean | undefined, fallback: number, lo: number, hi: number, integer = false): number {
  if (v === undefined) return fallback;
  const x = Number(v);
  if (typeof v !== "string" || v.trim() === "" || !Number.isFinite(x) || x < lo || x > hi || (integer && !Number.isInteger(x))) {
    throw new UsageError(`--${name}: expected ${integer ? "an integer" : "a number"} in ${lo}..${hi}, got '${v}'`);
  }
  return x;
}

/** --seed and --threads: how nested dissection runs (threads undefined: the library's default). */
export interface DissectionChoice {
  readonly seed: number;
  readonly threads: number | undefined;
}

export function dissectionChoice(values: Parsed["values"]): DissectionChoice {
  return {
    seed: numberOption("seed", values.seed, 1, 0, 2 ** 31 - 1, true),
    threads: values.threads === undefined ? undefined : numberOption("threads", values.threads, 1, 1, 256, true),
  };
}

/** Exactly `count` positional arguments, named for the message. */
export function positionals(command: string, p: string[], names: string[]): string[] {
  if (p.length < names.length) throw new UsageError(`${command}: missing ${names.slice(p.length).join(" and ")} (see septum ${command} --help)`);
  if (p.length > names.length) throw new UsageError(`${command}: unexpected argument '${p[names.length]}' (see septum ${command} --help)`);
  return p;
}
