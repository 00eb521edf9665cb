import { generateDemo } from '../../sample-data/generator/generate.js';
import { allowOnly, optional, parseArgs } from '../args.js';
import { err, out, type Command } from '../command.js';
import { sampleDataDir } from '../package-paths.js';

export const makeDemoCommand: Command = {
  name: 'make-demo',
  summary: 'build the invented demo scenario (reference, three runs, spin-up, stations)',
  usage: [
    'stillwater make-demo [--dir DIR]',
    '',
    'Writes the demo scenario into DIR/generated (default: the sample-data folder of this checkout):',
    'a 1° reference climatology, three runs on a curvilinear ~2° grid, spin-up snapshots and stations.',
    'All of it is invented data for trying the tool; it is never a check value.',
  ].join('\n'),
  async run(argv) {
    const args = parseArgs(argv);
    allowOnly(args, 'make-demo', ['dir']);
    const dir = optional(args, 'dir') ?? sampleDataDir();
    const started = Date.now();
    const paths = await generateDemo(dir, (s) => err(`make-demo: ${s}`));
    out(`demo scenario written to ${paths.dir} in ${((Date.now() - started) / 1000).toFixed(1)} s; recipe ${paths.recipe}`);
    return 0;
  },
};
