/**
 * Takeproof's web server: Next.js inside a thin Node HTTP server that
 * - names the client's address for the sign-in limits (`x-takeproof-client-address`): the socket's
 *   remote address, or the address a proxy listed in TRUSTED_PROXIES forwarded;
 * - drops the forwarding headers a client that is not such a proxy sent itself;
 * - answers an over-long address (414) or a malformed request (400, 431) at once, with one log line.
 * HOST and PORT say where it listens.
 */
import { createServer, STATUS_CODES } from 'node:http';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import next from 'next';
import { clientAddressOf, parseTrustedProxies } from './client-address';

/** RFC 9112 §3: recipients should accept request lines of at least 8000 octets; longer ones are refused. */
const MAX_URL_BYTES = 8000;
const FORWARDING_HEADERS = ['x-forwarded-for', 'x-forwarded-host', 'x-forwarded-proto', 'x-forwarded-port', 'forwarded'];

const host = process.env.HOST ?? '127.0.0.1';
const port = Number(process.env.PORT ?? 3000);
const trusted = parseTrustedProxies(process.env.TRUSTED_PROXIES ?? '');
const app = next({ dev: false, dir: path.join(path.dirname(fileURLToPath(import.meta.url)), '..'), hostname: host, port });
await app.prepare();
const handle = app.getRequestHandler();

const server = createServer({ maxHeaderSize: 32 * 1024 }, (request, response) => {
  if (Buffer.byteLength(request.url ?? '') > MAX_URL_BYTES) {
    response.writeHead(414, { 'Content-Type': 'text/plain; charset=utf-8', Connection: 'close' });
    response.end(`The address is longer than Takeproof reads (${MAX_URL_BYTES} bytes).\n`);
    return;
  }
  const peer = request.socket.remoteAddress ?? '';
  request.headers['x-takeproof-client-address'] = clientAddressOf(peer, [request.headers['x-forwarded-for'] ?? []].flat().join(','), trusted);
  if (!trusted.has(peer.replace(/^::ffff:/i, ''))) for (const name of FORWARDING_HEADERS) delete request.headers[name];
  void handle(request, response);
});

server.on('clientError', (error: NodeJS.ErrnoException, socket) => {
  // A client that hangs up (mid-request too) is routine; a request that cannot be parsed gets a short answer and one line.
  if (error.code === 'ECONNRESET' || error.code === 'HPE_INVALID_EOF_STATE' || !socket.writable) {
    socket.destroy();
    return;
  }
  const status = error.code === 'HPE_HEADER_OVERFLOW' ? 431 : error.code === 'ERR_HTTP_REQUEST_TIMEOUT' ? 408 : 400;
  console.error(`Refused a request: ${status} (${error.code ?? error.message})`);
  socket.end(`HTTP/1.1 ${status} ${STATUS_CODES[status]}\r\nConnection: close\r\nContent-Length: 0\r\n\r\n`);
});

// Idle connections stay open longer than the usual 60 s of a reverse proxy in front, so the proxy
// never reuses one the server is closing [common practice]; headers must still arrive within 66 s.
server.keepAliveTimeout = 65_000;
server.headersTimeout = 66_000;

server.listen(port, host, () => console.log(`Takeproof web server listening on http://${host}:${port}`));
