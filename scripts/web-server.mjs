// The web process: Next's request handler behind a plain node:http server, so the client's socket address
// reaches the app (scripts/lib/forwarded-for.mjs says why `next start` alone cannot). Usage:
//   node scripts/web-server.mjs -H 127.0.0.1 -p 3000
import http from 'node:http';
import { parseArgs } from 'node:util';
import next from 'next';
import { appendPeerAddress } from './lib/forwarded-for.mjs';

const { values } = parseArgs({ options: { hostname: { type: 'string', short: 'H', default: '127.0.0.1' }, port: { type: 'string', short: 'p', default: '3000' } } });
const hostname = values.hostname;
const port = Number(values.port);
process.env.NODE_ENV ??= 'production';

const app = next({ dev: false, hostname, port, dir: process.cwd() });
const handle = app.getRequestHandler();
await app.prepare();

const server = http.createServer((request, response) => {
  appendPeerAddress(request);
  handle(request, response).catch((error) => {
    console.error(JSON.stringify({ level: 'error', msg: 'request failed in the web server', error: String(error?.stack ?? error) }));
    if (!response.headersSent) response.writeHead(500);
    response.end();
  });
});
// As `next start` does: idle keep-alive connections close after 5 s (Node's default), headers within 60 s.
server.listen(port, hostname, () => {
  console.log(`Sowcast web listening on http://${hostname}:${port}`);
});
for (const signal of ['SIGTERM', 'SIGINT']) {
  process.on(signal, () => {
    server.close(() => process.exit(0));
    setTimeout(() => process.exit(0), 3_000).unref();
  });
}
