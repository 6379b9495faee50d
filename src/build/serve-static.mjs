/**
 * Serves a built Capstan folder on localhost the way a plain static host would: files as they are,
 * `/settings` from `settings.html`, and `200.html` (the SPA fallback) for any other path, so deep links
 * such as `/process/<id>` work. `vite preview` does not serve that fallback, hence this small server.
 *
 * Text files (pages, scripts, styles, the manifest) are sent compressed — brotli when the browser accepts it,
 * else gzip — as real static hosts do, with `Vary: Accept-Encoding`. Each file is compressed once, at the
 * highest settings, when it is first asked for, and kept while the file does not change.
 *
 * Usage: node src/build/serve-static.mjs [DIR] [--port N] [--host H]
 */
import { createReadStream, readFileSync, statSync } from 'node:fs';
import { brotliCompressSync, constants as zlib, gzipSync } from 'node:zlib';
import { createServer } from 'node:http';
import { extname, join, normalize, resolve } from 'node:path';

const args = process.argv.slice(2);
const flag = (name, fallback) => {
  const i = args.indexOf(name);
  return i >= 0 && args[i + 1] ? args[i + 1] : fallback;
};
const root = resolve(args.find((a, i) => !a.startsWith('--') && !args[i - 1]?.startsWith('--')) ?? 'build');
const port = Number(flag('--port', process.env.PORT ?? '4173'));
const host = flag('--host', '127.0.0.1');

const TYPES = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.webmanifest': 'application/manifest+json',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.txt': 'text/plain; charset=utf-8'
};

const COMPRESSIBLE = new Set(['.html', '.js', '.mjs', '.css', '.json', '.webmanifest', '.svg', '.txt']);
/** path → { mtimeMs, br, gzip } */
const compressed = new Map();

/** The compressed body of a file for the encodings the request accepts, or undefined to send it as it is. */
function encodedBody(file, acceptEncoding) {
  if (!COMPRESSIBLE.has(extname(file))) return undefined;
  const accepted = new Set(
    acceptEncoding
      .split(',')
      .map((part) => part.trim().split(';'))
      .filter(([, q]) => !q || Number(q.trim().replace(/^q=/, '')) > 0)
      .map(([name]) => name.trim().toLowerCase())
  );
  const encoding = accepted.has('br') ? 'br' : accepted.has('gzip') ? 'gzip' : undefined;
  if (!encoding) return undefined;
  const mtimeMs = statSync(file).mtimeMs;
  let entry = compressed.get(file);
  if (!entry || entry.mtimeMs !== mtimeMs) {
    entry = { mtimeMs };
    compressed.set(file, entry);
  }
  if (!entry[encoding]) {
    const raw = readFileSync(file);
    entry[encoding] =
      encoding === 'br'
        ? brotliCompressSync(raw, {
            params: { [zlib.BROTLI_PARAM_QUALITY]: 11, [zlib.BROTLI_PARAM_SIZE_HINT]: raw.length }
          })
        : gzipSync(raw, { level: 9 });
  }
  return { encoding, body: entry[encoding] };
}

function fileFor(urlPath) {
  const clean = normalize(decodeURIComponent(urlPath)).replace(/^(\.\.[/\\])+/, '');
  const candidates = [clean, `${clean}.html`, join(clean, 'index.html')];
  for (const candidate of candidates) {
    const full = join(root, candidate);
    if (!full.startsWith(root)) continue;
    try {
      if (statSync(full).isFile()) return full;
    } catch {
      // try the next form
    }
  }
  return undefined;
}

const server = createServer((req, res) => {
  const url = new URL(req.url ?? '/', 'http://localhost');
  let file = fileFor(url.pathname);
  let status = 200;
  if (!file) {
    // Asset-like paths that do not exist are real 404s; page paths get the app shell.
    if (extname(url.pathname) && extname(url.pathname) !== '.html') status = 404;
    else file = join(root, '200.html');
  }
  if (status === 404 || !file) {
    res.writeHead(404, { 'content-type': 'text/plain; charset=utf-8' });
    res.end(`Not found: ${url.pathname}`);
    return;
  }
  const immutable = url.pathname.startsWith('/_app/immutable/');
  const headers = {
    'content-type': TYPES[extname(file)] ?? 'application/octet-stream',
    // Hashed assets never change; everything else (pages, the service worker) is revalidated each time.
    'cache-control': immutable ? 'public, max-age=31536000, immutable' : 'no-cache'
  };
  const encoded = encodedBody(file, String(req.headers['accept-encoding'] ?? ''));
  if (COMPRESSIBLE.has(extname(file))) headers.vary = 'Accept-Encoding';
  if (encoded) {
    res.writeHead(status, {
      ...headers,
      'content-encoding': encoded.encoding,
      'content-length': encoded.body.length
    });
    res.end(req.method === 'HEAD' ? undefined : encoded.body);
    return;
  }
  res.writeHead(status, headers);
  createReadStream(file).pipe(res);
});

server.listen(port, host, () => {
  // Port 0 asks the system for a free port; print the real one so tests can read it.
  const actual = server.address().port;
  console.log(`Capstan is running at http://${host === '127.0.0.1' ? 'localhost' : host}:${actual}/ (serving ${root})`);
});

for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => server.close(() => process.exit(0)));
