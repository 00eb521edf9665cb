import { join } from 'node:path';
import { packageRoot } from '../app/package-root.js';

export { packageRoot, toolVersion } from '../app/package-root.js';

export function sampleDataDir(): string {
  return join(packageRoot(), 'sample-data');
}
