// Orbitab's command line: `npm run --silent cli -- <command> [args]`.
// A small dispatcher: each subcommand lives in its own module under server/cli/ and is listed in
// `commands` below. Exit codes: 0 success, 1 the work ran but something failed, 2 usage error.
import { pathToFileURL } from 'node:url';
import { resolve } from 'node:path';
import { backupCommand } from './cli/backup.js';
import { evalCommand } from './cli/eval.js';
import { recalcCommand } from './cli/recalc.js';
import { restoreCommand } from './cli/restore.js';
import { EXIT_OK, EXIT_USAGE, type CliCommand, type CliIO } from './cli/io.js';

export const commands: Record<string, CliCommand> = {
  eval: evalCommand,
  recalc: recalcCommand,
  backup: backupCommand,
  restore: restoreCommand,
};

export function usage(): string {
  const width = Math.max(...Object.keys(commands).map((n) => n.length), 4);
  const list = Object.entries(commands).map(([name, c]) => `  ${name.padEnd(width)}  ${c.summary}`);
  return [
    'Usage: npm run --silent cli -- <command> [options]',
    '',
    'Commands:',
    ...list,
    `  ${'help'.padEnd(width)}  show this text, or "help <command>" for one command`,
    '',
    'Exit status: 0 success, 1 the command ran but something failed, 2 usage error.',
  ].join('\n');
}

export async function main(argv: string[], io: CliIO): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === 'help' || name === '--help' || name === '-h') {
    const topic = name === 'help' ? rest[0] : undefined;
    if (topic !== undefined && !(topic in commands)) {
      io.stderr(`unknown command '${topic}'\n\n${usage()}`);
      return EXIT_USAGE;
    }
    io.stdout(topic !== undefined ? commands[topic].usage : usage());
    return name === undefined ? EXIT_USAGE : EXIT_OK;
  }
  const command = Object.hasOwn(commands, name) ? commands[name] : undefined;
  if (!command) {
    io.stderr(`unknown command '${name}'\n\n${usage()}`);
    return EXIT_USAGE;
  }
  return command.run(rest, io);
}

if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  const io: CliIO = {
    stdout: (line) => process.stdout.write(`${line}\n`),
    stderr: (line) => process.stderr.write(`${line}\n`),
  };
  main(process.argv.slice(2), io).then(
    (code) => {
      process.exitCode = code;
    },
    (error: unknown) => {
      process.stderr.write(`cli: ${error instanceof Error ? error.stack ?? error.message : String(error)}\n`);
      process.exitCode = 1;
    },
  );
}
