// `npm start`: everything from a fresh clone to a running service. See scripts/start.ts for the rest.
import { ensurePackages, loadTypeScript, step } from './bootstrap.mjs';

step(1, 6, 'Checking npm packages');
ensurePackages((line) => console.log(`      ${line}`));
await loadTypeScript();
await import('./start.ts');
