// What a CLI subcommand may touch: two output streams. Tests pass collectors; the binary passes
// process.stdout/stderr. Exit codes: 0 success, 1 the work ran but something failed, 2 usage error.
export interface CliIO {
  stdout: (line: string) => void;
  stderr: (line: string) => void;
}

export interface CliCommand {
  /** One line for the command list in `cli help`. */
  summary: string;
  /** Full usage text for `cli help <command>`. */
  usage: string;
  run: (args: string[], io: CliIO) => number | Promise<number>;
}

export const EXIT_OK = 0;
export const EXIT_FAILED = 1;
export const EXIT_USAGE = 2;
