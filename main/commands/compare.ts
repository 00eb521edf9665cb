import { StillwaterError } from '../../app/errors.js';
import type { Command } from '../command.js';

// PLACEHOLDER: to be replaced by the issue that builds this command.
export const compareCommand: Command = {
  name: 'compare',
  summary: '(being built)',
  usage: 'stillwater compare (being built)',
  async run(): Promise<number> {
    throw new StillwaterError('E_INTERNAL', 'stillwater compare is not built yet.');
  },
};
