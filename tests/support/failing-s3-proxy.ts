import http from 'node:http';
import type { AddressInfo } from 'node:net';

// Stands between the app and the fake S3 service and lets through only the first
// `allowedWrites` object writes; later ones get S3's own 503 (ServiceUnavailable),
// as a store that falls over half-way through an upload answers. Everything else
// is passed on as it is.
export async function startS3ProxyFailingWrites(
  target: string,
  allowedWrites: number,
): Promise<{ endpoint: string; stop(): Promise<void> }> {
  const upstream = new URL(target);
  let writes = 0;
  const server = http.createServer((req, res) => {
    const isObjectWrite = req.method === 'PUT' && /^\/[^/]+\/.+/.test(req.url ?? '');
    if (isObjectWrite && writes++ >= allowedWrites) {
      req.resume();
      res.writeHead(503, { 'content-type': 'application/xml' });
      res.end(
        '<?xml version="1.0" encoding="UTF-8"?><Error><Code>ServiceUnavailable</Code><Message>Please reduce your request rate.</Message></Error>',
      );
      return;
    }
    const forwarded = http.request(
      { host: upstream.hostname, port: upstream.port, method: req.method, path: req.url, headers: req.headers },
      (answer) => {
        res.writeHead(answer.statusCode ?? 502, answer.headers);
        answer.pipe(res);
      },
    );
    forwarded.on('error', () => res.destroy());
    req.pipe(forwarded);
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return {
    endpoint: `http://127.0.0.1:${port}`,
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
