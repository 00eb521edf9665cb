import { dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { isStillwaterError } from '../app/errors.js';
import { useHdf5OffThread } from './hdf5-off-thread.js';
import type { Command } from './command.js';
import { err, out } from './command.js';
import { inspectCommand } from './commands/inspect.js';
import { regridCommand } from './commands/regrid.js';
import { compareCommand } from './commands/compare.js';
import { spinupCommand } from './commands/spinup.js';
import { lineCommand } from './commands/line.js';
import { pointsCommand } from './commands/points.js';
import { serveCommand, startCommand } from './commands/serve.js';
import { makeDemoCommand } from './commands/make-demo.js';
import { mergeCommand } from './commands/merge.js';
import { reportCommand } from './commands/report.js';

const commands: Command[] = [
  inspectCommand,
  regridCommand,
  compareCommand,
  mergeCommand,
  reportCommand,
  spinupCommand,
  lineCommand,
  pointsCommand,
  serveCommand,
  startCommand,
  makeDemoCommand,
];

function help(): string {
  const width = Math.max(...commands.map((c) => c.name.length));
  return [
    'stillwater: skill of ocean biogeochemistry model runs against observational climatologies',
    '',
    'usage: stillwater <command> [options]',
    '',
    ...commands.map((c) => `  ${c.name.padEnd(width)}  ${c.summary}`),
    '',
    'stillwater <command> --help shows the options of one command.',
  ].join('\n');
}

export async function main(argv: string[]): Promise<number> {
  const [name, ...rest] = argv;
  if (!name || name === '--help' || name === 'help') {
    out(help());
    return name ? 0 : 2;
  }
  const command = commands.find((c) => c.name === name);
  if (!command) {
    err(`stillwater: unknown command '${name}'. Commands: ${commands.map((c) => c.name).join(', ')}.`);
    return 2;
  }
  if (rest.includes('--help')) {
    out(command.usage);
    return 0;
  }
  try {
    return await command.run(rest);
  } catch (e) {
    if (isStillwaterError(e) && e.isBadInput) {
      err(`stillwater ${name}: ${e.message}`);
      return 2;
    }
    err(`stillwater ${name}: internal fault: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}`);
    return 1;
  }
}

// the HDF5 library runs where a deadline can stop it (dist/hdf5-worker.mjs beside this bundle)
useHdf5OffThread(dirname(fileURLToPath(import.meta.url)));

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (e) => {
    err(`stillwater: internal fault: ${String(e)}`);
    process.exitCode = 1;
  },
);
