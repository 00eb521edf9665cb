import { StillwaterError } from '../../app/errors.js';
import type { Command } from '../command.js';

// PLACEHOLDER: to be replaced by the issue that builds this command.
export const regridCommand: Command = {
  name: 'regrid',
  summary: '(being built)',
  usage: 'stillwater regrid (being built)',
  async run(): Promise<number> {
    throw new StillwaterError('E_INTERNAL', 'stillwater regrid is not built yet.');
  },
};
