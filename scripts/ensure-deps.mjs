// Installs the project's npm dependencies when they are missing (fresh clone), using the lockfile.
import { existsSync } from 'node:fs';
import { execSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

export function ensureDeps() {
	const marker = path.join(root, 'node_modules', '.package-lock.json');
	if (!existsSync(marker)) {
		console.log('Installing dependencies (npm ci)…');
		execSync('npm ci --loglevel=notice', { cwd: root, stdio: 'inherit' });
	}
}

export function run(cmd, opts = {}) {
	execSync(cmd, { cwd: root, stdio: 'inherit', ...opts });
}
