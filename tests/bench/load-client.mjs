// The heavy side of tests/bench/server-load.bench.ts, in a process of its own so that its sockets and replies
// never share an event loop with the light requests being timed.
//   node load-client.mjs JOB_JSON   JOB = { port, token, requests: [{ name, input }] }
// Sends every request at once, prints {"sent":N} when all are on their way, then one summary line:
// {"done":N,"busy":N,"refused":N,"other":N,"ms":N}.
import { Agent, request } from 'node:http';

const job = JSON.parse(process.argv[2]);
const agent = new Agent({ keepAlive: true, maxSockets: Infinity });
const t0 = performance.now();

function call({ name, input }) {
  return new Promise((resolve) => {
    const body = JSON.stringify({ input });
    const req = request(
      { host: '127.0.0.1', port: job.port, method: 'POST', path: `/api/${name}`, agent, headers: { host: `127.0.0.1:${job.port}`, 'content-type': 'application/json', 'x-stillwater-token': job.token } },
      (res) => {
        // a refusal by a service comes back as 200 with a JSON error: not work done
        const refused = res.statusCode === 200 && String(res.headers['content-type']).startsWith('application/json');
        res.resume();
        res.on('end', () => resolve(refused ? 'refused' : (res.statusCode ?? 0)));
      },
    );
    req.on('error', () => resolve(0));
    req.end(body);
  });
}

const replies = job.requests.map(call);
process.stdout.write(JSON.stringify({ sent: replies.length }) + '\n');
const codes = await Promise.all(replies);
const count = (f) => codes.filter(f).length;
process.stdout.write(JSON.stringify({ done: count((c) => c === 200), busy: count((c) => c === 503), refused: count((c) => c === 'refused'), other: count((c) => c !== 200 && c !== 503 && c !== 'refused'), ms: Math.round(performance.now() - t0) }) + '\n');
agent.destroy();
