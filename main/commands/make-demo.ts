import { StillwaterError } from '../../app/errors.js';
import type { Command } from '../command.js';

// PLACEHOLDER: to be replaced by the issue that builds this command.
export const makeDemoCommand: Command = {
  name: 'make-demo',
  summary: '(being built)',
  usage: 'stillwater make-demo (being built)',
  async run(): Promise<number> {
    throw new StillwaterError('E_INTERNAL', 'stillwater make-demo is not built yet.');
  },
};
