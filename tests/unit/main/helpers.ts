import { request } from 'node:http';

export interface RawReply {
  status: number;
  headers: Record<string, string | string[] | undefined>;
  body: Buffer;
}

/** One HTTP request with full control over Host, Origin and the raw path (fetch would normalise them). */
export function raw(port: number, o: { method?: string; path: string; headers?: Record<string, string>; body?: string; host?: string }): Promise<RawReply> {
  return new Promise((resolve, reject) => {
    const req = request(
      { host: '127.0.0.1', port, method: o.method ?? 'GET', path: o.path, headers: { host: o.host ?? `127.0.0.1:${port}`, ...(o.headers ?? {}) } },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
      },
    );
    req.on('error', reject);
    if (o.body !== undefined) req.write(o.body);
    req.end();
  });
}
