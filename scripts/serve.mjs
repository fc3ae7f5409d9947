// Serves the built single-page app from build/ with an index.html fallback for client routes.
// Usage: node scripts/serve.mjs [--port N]   (PORT env var also honoured; default 4173)
import http from 'node:http';
import { readFile, stat } from 'node:fs/promises';
import path from 'node:path';
import { root } from './ensure-deps.mjs';

const types = {
	'.html': 'text/html; charset=utf-8', '.js': 'text/javascript; charset=utf-8', '.mjs': 'text/javascript; charset=utf-8',
	'.css': 'text/css; charset=utf-8', '.json': 'application/json; charset=utf-8', '.svg': 'image/svg+xml',
	'.png': 'image/png', '.csv': 'text/csv; charset=utf-8', '.ico': 'image/x-icon', '.txt': 'text/plain; charset=utf-8',
	'.webmanifest': 'application/manifest+json', '.woff2': 'font/woff2'
};

export function createServer(dir = path.join(root, 'build')) {
	return http.createServer(async (req, res) => {
		try {
			const url = new URL(req.url ?? '/', 'http://localhost');
			let file = path.normalize(path.join(dir, decodeURIComponent(url.pathname)));
			if (!file.startsWith(dir)) { res.writeHead(403); res.end(); return; }
			let info = await stat(file).catch(() => null);
			if (info?.isDirectory()) { file = path.join(file, 'index.html'); info = await stat(file).catch(() => null); }
			if (!info) file = path.join(dir, 'index.html');
			const body = await readFile(file);
			res.writeHead(200, { 'content-type': types[path.extname(file)] ?? 'application/octet-stream', 'cache-control': 'no-cache' });
			res.end(body);
		} catch (err) {
			res.writeHead(500, { 'content-type': 'text/plain' });
			res.end(String(err));
		}
	});
}

export function listen(server, port) {
	return new Promise((resolve, reject) => {
		server.once('error', reject);
		server.listen(port, '127.0.0.1', () => resolve(server.address().port));
	});
}

if (import.meta.url === `file://${process.argv[1]}`) {
	const i = process.argv.indexOf('--port');
	const port = Number(i > 0 ? process.argv[i + 1] : process.env.PORT ?? 4173);
	const actual = await listen(createServer(), port);
	console.log(`Identiplate is ready at http://127.0.0.1:${actual}/ (the demo plan is on the plans list)`);
}
