import { StillwaterError } from '../../app/errors.js';
import type { Command } from '../command.js';

// PLACEHOLDER: to be replaced by the issue that builds this command.
export const lineCommand: Command = {
  name: 'line',
  summary: '(being built)',
  usage: 'stillwater line (being built)',
  async run(): Promise<number> {
    throw new StillwaterError('E_INTERNAL', 'stillwater line is not built yet.');
  },
};
