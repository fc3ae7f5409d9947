// `npm start`: install dependencies when missing, build the app, serve it on PORT (default 4173).
import { ensureDeps, run } from './ensure-deps.mjs';

ensureDeps();
run('npx vite build');
run('node scripts/serve.mjs');
