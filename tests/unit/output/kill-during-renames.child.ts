/** Run by output-set.test.ts as a child process: place a set of three files and die by SIGKILL after the second. */
import { openOutputSet } from '../../../app/output/output-set.js';

const dir = process.argv[2];
const set = await openOutputSet(dir, {
  afterPlaced: (_name, index) => {
    if (index === 1) process.kill(process.pid, 'SIGKILL');
  },
});
for (const name of ['a.csv', 'b.csv', 'c.csv']) await set.add(name, `new ${name}`);
await set.commit();
