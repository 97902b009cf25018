/**
 * What the command needs from its surroundings, passed in so that tests run
 * it in-process: writers for stdout and stderr, whether stderr is a terminal,
 * the working directory, and a clock.
 */
import { SeptumError } from "../errors.js";

export interface CliIO {
  stdout(text: string): void;
  stderr(text: string): void;
  /** true when stderr is an interactive terminal (progress lines are drawn only then) */
  readonly stderrIsTTY: boolean;
  /** directory relative paths are resolved against */
  readonly cwd: string;
  /** seconds, monotonic */
  now(): number;
}

/** A mistake on the command line (unknown option, missing argument): exit code 2. */
export class UsageError extends SeptumError {}

/** A problem with a file the user named: the message already names the file. Exit code 1. */
export class FileError extends SeptumError {}

/** The real process: stdout/stderr of Node. */
export function processIO(): CliIO {
  return {
    stdout: (t) => process.stdout.write(t),
    stderr: (t) => process.stderr.write(t),
    stderrIsTTY: Boolean(process.stderr.isTTY),
    cwd: process.cwd(),
    now: () => performance.now() / 1000,
  };
}
