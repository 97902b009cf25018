/**
 * The `septum` command. `main(argv, io)` takes the arguments after the
 * program name and the writers to use, and returns the exit code, so tests
 * run it in-process; the bottom of this file runs it when executed directly.
 */
import { realpathSync } from "node:fs";
import { setFlagsFromString } from "node:v8";
import { pathToFileURL } from "node:url";
import { SeptumError } from "../errors.js";
import { analyzeCommand } from "./analyze.js";
import { demoCommand } from "./demo.js";
import { generateCommand } from "./generate.js";
import { HELP, MAIN_HELP } from "./help.js";
import { processIO, UsageError, type CliIO } from "./io.js";
import { parseCommand } from "./options.js";
import { reportCommand } from "./report.js";
import { solveCommand } from "./solve.js";
import { VERSION } from "./version.js";

export type { CliIO } from "./io.js";

const COMMANDS: Record<string, (io: CliIO, p: ReturnType<typeof parseCommand>) => number> = {
  solve: solveCommand, analyze: analyzeCommand, report: reportCommand, generate: generateCommand, demo: demoCommand,
};

/** Run the command line `argv` (without node and the script); returns the exit code. */
export function main(argv: readonly string[], io: CliIO = processIO()): number {
  const args = [...argv];
  const debug = args.includes("--debug");
  try {
    if (args.length === 0 || args[0] === "--help" || args[0] === "-h" || args[0] === "help") {
      const topic = args[0] === "help" ? args[1] : undefined;
      io.stdout(topic && HELP[topic] ? HELP[topic] : MAIN_HELP);
      return args.length === 0 ? 2 : 0;
    }
    if (args[0] === "--version" || args[0] === "-v") {
      io.stdout(`${VERSION}\n`);
      return 0;
    }
    const command = args[0];
    const run = COMMANDS[command];
    if (!run) throw new UsageError(`unknown command '${command}'; expected ${Object.keys(COMMANDS).join(", ")} (septum --help)`);
    const parsed = parseCommand(command, args.slice(1));
    if (parsed.values.help) {
      io.stdout(HELP[command]);
      return 0;
    }
    return run(io, parsed);
  } catch (e) {
    return reportError(io, e, debug);
  }
}

/** One line on stderr; the stack only with --debug. Exit 2 for usage, 1 for input/numerical problems, 70 for bugs. */
function reportError(io: CliIO, e: unknown, debug: boolean): number {
  const usage = e instanceof UsageError;
  const known = e instanceof SeptumError;
  const message = e instanceof Error ? e.message : String(e);
  const oneLine = message.split("\n")[0];
  if (known) io.stderr(`septum: ${oneLine}\n`);
  else io.stderr(`septum: internal error: ${oneLine} (run again with --debug for the stack trace)\n`);
  if (usage && !debug) io.stderr("Try 'septum --help'.\n");
  if (debug && e instanceof Error && e.stack) io.stderr(`${e.stack}\n`);
  return usage ? 2 : known ? 1 : 70;
}

function invokedDirectly(): boolean {
  try {
    return process.argv[1] !== undefined && import.meta.url === pathToFileURL(realpathSync(process.argv[1])).href;
  } catch {
    return false;
  }
}

if (invokedDirectly()) {
  enableFusedMultiplyAdd();
  process.exitCode = main(process.argv.slice(2));
}

/**
 * The command owns its process, so it lets V8 accept WebAssembly relaxed SIMD
 * (behind a flag in Node 20): the kernels' fused multiply-add build then
 * validates and "auto" picks it (about 1.4× on the dense kernels, 1.25× on a
 * whole factorization, measured here). The library itself never changes
 * engine flags. Must run before the first kernel module is compiled.
 */
function enableFusedMultiplyAdd(): void {
  try {
    setFlagsFromString("--experimental-wasm-relaxed-simd");
  } catch {
    // An engine without the flag keeps the plain SIMD build.
  }
}
