import { StillwaterError } from '../../app/errors.js';
import type { Command } from '../command.js';

// PLACEHOLDER: to be replaced by the issue that builds this command.
export const spinupCommand: Command = {
  name: 'spinup',
  summary: '(being built)',
  usage: 'stillwater spinup (being built)',
  async run(): Promise<number> {
    throw new StillwaterError('E_INTERNAL', 'stillwater spinup is not built yet.');
  },
};
