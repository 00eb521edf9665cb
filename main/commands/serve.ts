import { StillwaterError } from '../../app/errors.js';
import type { Command } from '../command.js';

// PLACEHOLDER: to be replaced by the workbench issue.
export const serveCommand: Command = {
  name: 'serve',
  summary: '(being built)',
  usage: 'stillwater serve (being built)',
  async run(): Promise<number> {
    throw new StillwaterError('E_INTERNAL', 'stillwater serve is not built yet.');
  },
};
export const startCommand: Command = { ...serveCommand, name: 'start' };
