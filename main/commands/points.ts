import { StillwaterError } from '../../app/errors.js';
import type { Command } from '../command.js';

// PLACEHOLDER: to be replaced by the issue that builds this command.
export const pointsCommand: Command = {
  name: 'points',
  summary: '(being built)',
  usage: 'stillwater points (being built)',
  async run(): Promise<number> {
    throw new StillwaterError('E_INTERNAL', 'stillwater points is not built yet.');
  },
};
