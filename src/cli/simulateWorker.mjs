// Worker entry for the simulation pool: registers tsx so the TypeScript core loads, then serves requests.
import { register } from 'tsx/esm/api';
register();
await import('./simulateWorkerMain.ts');
