/**
 * Browser mode: the service table over HTTP on 127.0.0.1, plus the renderer's own files.
 * Every request needs the per-start token (from the printed address, then a cookie or header), a Host of
 * 127.0.0.1/localhost on our port, and, when the browser sends one, an Origin of the same; this keeps other
 * web pages (DNS rebinding, cross-site requests) away from the local files.
 */
import { randomBytes, timingSafeEqual } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { ROUTES, TOKEN_COOKIE, TOKEN_HEADER, type ProgressEvent } from '../contract/transport.js';
import { WIRE_CONTENT_TYPE, encodeWire } from '../contract/wire.js';
import { securityHeaders } from './csp.js';
import type { Dispatcher } from './dispatch.js';
import { contentType, projectRoot, staticFile } from './static-files.js';

export const BIND_ADDRESS = '127.0.0.1';
const MAX_BODY = 4 * 1024 * 1024;

export interface ServerOptions {
  dispatcher: Dispatcher;
  /** 0 or absent: a free port */
  port?: number;
  /** absent: a fresh random token */
  token?: string;
  /** the recipe the page should open first */
  startRecipe?: string | null;
  /** project folder holding dist/renderer and node_modules */
  root?: string;
}

export interface RunningServer {
  server: Server;
  port: number;
  token: string;
  /** the address to open, token included */
  url: string;
  close(): Promise<void>;
}

export function newToken(): string {
  return randomBytes(24).toString('base64url');
}

function sameSecret(a: string | undefined, b: string): boolean {
  if (!a) return false;
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}

function cookieValue(req: IncomingMessage, name: string): string | undefined {
  const header = req.headers.cookie;
  if (!header) return undefined;
  for (const part of header.split(';')) {
    const eq = part.indexOf('=');
    if (eq > 0 && part.slice(0, eq).trim() === name) return part.slice(eq + 1).trim();
  }
  return undefined;
}

function send(res: ServerResponse, status: number, type: string, body: string | Uint8Array, extra: Record<string, string> = {}): void {
  res.writeHead(status, { ...securityHeaders(), 'Content-Type': type, ...extra });
  res.end(body);
}

function sendJson(res: ServerResponse, status: number, value: unknown): void {
  send(res, status, 'application/json; charset=utf-8', JSON.stringify(value));
}

function refuse(res: ServerResponse, status: number, sentence: string): void {
  send(res, status, 'text/plain; charset=utf-8', sentence + '\n');
}

async function readBody(req: IncomingMessage): Promise<string> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const c of req) {
    size += (c as Buffer).length;
    if (size > MAX_BODY) throw new Error('too large');
    chunks.push(c as Buffer);
  }
  return Buffer.concat(chunks).toString('utf8');
}

export async function startServer(opts: ServerOptions): Promise<RunningServer> {
  const token = opts.token ?? newToken();
  const root = opts.root ?? projectRoot();
  const dispatcher = opts.dispatcher;
  let port = 0;
  const cookieName = () => `${TOKEN_COOKIE}_${port}`;
  const allowedHosts = () => [`${BIND_ADDRESS}:${port}`, `localhost:${port}`];
  const allowedOrigins = () => allowedHosts().map((h) => `http://${h}`);

  const handle = async (req: IncomingMessage, res: ServerResponse): Promise<void> => {
    // 1. Host: a rebinding attack reaches us under a foreign name
    const host = (req.headers.host ?? '').toLowerCase();
    if (!allowedHosts().includes(host)) return refuse(res, 403, `Refused: host '${host}' is not this workbench.`);
    // 2. Origin: when present, it must be our own page
    const origin = req.headers.origin;
    if (origin !== undefined && !allowedOrigins().includes(origin)) return refuse(res, 403, `Refused: requests from '${origin}' are not accepted.`);
    // another port on this machine is the "same site" to a browser and gets SameSite cookies: refuse it too
    const site = req.headers['sec-fetch-site'];
    if (site === 'cross-site' || site === 'same-site') return refuse(res, 403, `Refused: ${site} requests are not accepted.`);
    // 3. token: from the address once, then the cookie or the header
    const url = new URL(req.url ?? '/', `http://${BIND_ADDRESS}:${port}`);
    const fromQuery = url.searchParams.get('token') ?? undefined;
    const header = req.headers[TOKEN_HEADER];
    const given = [fromQuery, typeof header === 'string' ? header : undefined, cookieValue(req, cookieName())];
    if (!given.some((t) => sameSecret(t, token))) {
      return refuse(res, 401, 'This Stillwater server needs the address with its token, as printed when it started.');
    }
    const setCookie = sameSecret(fromQuery, token)
      ? { 'Set-Cookie': `${cookieName()}=${token}; HttpOnly; SameSite=Strict; Path=/` }
      : {};

    const path = url.pathname;
    if (path.startsWith(ROUTES.api)) {
      if (req.method !== 'POST') return refuse(res, 405, 'Services are called with POST.');
      if (!(req.headers['content-type'] ?? '').startsWith('application/json')) return refuse(res, 415, 'Services take JSON.');
      let body: { input?: unknown; jobId?: unknown };
      try {
        body = JSON.parse(await readBody(req)) as typeof body;
      } catch {
        return sendJson(res, 400, { error: { code: 'E_INPUT', message: 'The request body is not JSON of at most 4 MB.' } });
      }
      let name: string;
      try {
        name = decodeURIComponent(path.slice(ROUTES.api.length));
      } catch {
        return sendJson(res, 400, { error: { code: 'E_INPUT', message: 'The service name in the address is not valid percent-encoding.' } });
      }
      const reply = await dispatcher.call(name, body?.input ?? null, body?.jobId);
      if (reply.ok) return send(res, 200, WIRE_CONTENT_TYPE, encodeWire(reply.result));
      const notFound = reply.error.code === 'E_INPUT' && reply.error.message.startsWith('There is no service');
      // A refusal by a service (bad input, a missing file, a cancelled job) is a normal answer, not a failed
      // request: 200 with the error as JSON, so the browser does not log it as a fault. Only faults of ours
      // (E_INTERNAL) and unknown services get an error status.
      if (reply.error.code === 'E_BUSY') {
        res.setHeader('Retry-After', '2');
        return sendJson(res, 503, { error: reply.error });
      }
      return sendJson(res, notFound ? 404 : reply.error.code === 'E_INTERNAL' ? 500 : 200, { error: reply.error });
    }
    if (path === ROUTES.cancel) {
      if (req.method !== 'POST') return refuse(res, 405, 'Cancel with POST.');
      if (!(req.headers['content-type'] ?? '').startsWith('application/json')) return refuse(res, 415, 'Cancel takes JSON.');
      let jobId: unknown;
      try {
        jobId = (JSON.parse(await readBody(req)) as { jobId?: unknown }).jobId;
      } catch {
        jobId = undefined;
      }
      return sendJson(res, 200, { cancelled: typeof jobId === 'string' && dispatcher.cancel(jobId) });
    }
    if (path === ROUTES.events) {
      res.writeHead(200, { ...securityHeaders(), 'Content-Type': 'text/event-stream; charset=utf-8', Connection: 'keep-alive' });
      res.write(': progress of background work\n\n');
      const forward = (e: ProgressEvent): void => {
        res.write(`data: ${JSON.stringify(e)}\n\n`);
      };
      dispatcher.events.on('progress', forward);
      const beat = setInterval(() => res.write(': still here\n\n'), 15_000);
      req.on('close', () => {
        clearInterval(beat);
        dispatcher.events.off('progress', forward);
      });
      return;
    }
    if (path === ROUTES.startRecipe) return sendJson(res, 200, { recipe: opts.startRecipe ?? null });
    if (req.method !== 'GET' && req.method !== 'HEAD') return refuse(res, 405, 'Only GET for files.');
    const file = staticFile(path, root);
    if (!file) return refuse(res, 404, `No such file: ${path}`);
    res.writeHead(200, { ...securityHeaders(), 'Content-Type': contentType(file), ...setCookie });
    if (req.method === 'HEAD') return void res.end();
    createReadStream(file)
      .on('error', () => res.destroy())
      .pipe(res);
  };

  const server = createServer((req, res) => {
    handle(req, res).catch((e: unknown) => {
      if (!res.headersSent) refuse(res, 500, `Internal fault: ${e instanceof Error ? e.message : String(e)}`);
      else res.destroy();
    });
  });
  await new Promise<void>((resolveListen, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 0, BIND_ADDRESS, () => {
      server.off('error', reject);
      resolveListen();
    });
  });
  port = (server.address() as AddressInfo).port;
  return {
    server,
    port,
    token,
    url: `http://${BIND_ADDRESS}:${port}/?token=${token}`,
    close: () =>
      new Promise<void>((r) => {
        server.closeAllConnections();
        server.close(() => r());
      }),
  };
}
