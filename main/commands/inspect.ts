import { StillwaterError } from '../../app/errors.js';
import type { Command } from '../command.js';

// PLACEHOLDER: to be replaced by the issue that builds this command.
export const inspectCommand: Command = {
  name: 'inspect',
  summary: '(being built)',
  usage: 'stillwater inspect (being built)',
  async run(): Promise<number> {
    throw new StillwaterError('E_INTERNAL', 'stillwater inspect is not built yet.');
  },
};
