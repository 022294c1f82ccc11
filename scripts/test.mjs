// `npm test`: the same provisioning as `npm start`, then the type check and every test.
// PostgreSQL is provisioned by the Vitest global setup (tests/setup/global-setup.ts), which creates a
// throwaway database and drops it afterwards.
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { ensurePackages, root, step } from './bootstrap.mjs';

step(1, 3, 'Checking npm packages');
ensurePackages((line) => console.log(`      ${line}`));

step(2, 3, 'Type-checking (tsc --noEmit)');
const tsc = spawnSync(process.execPath, [join(root, 'node_modules', 'typescript', 'bin', 'tsc'), '--noEmit', '-p', 'tsconfig.json'], {
  cwd: root,
  stdio: 'inherit',
});
if (tsc.status !== 0) process.exit(tsc.status ?? 1);

step(3, 3, 'Running the tests (Vitest)');
const vitest = spawnSync(process.execPath, [join(root, 'node_modules', 'vitest', 'vitest.mjs'), 'run', ...process.argv.slice(2)], {
  cwd: root,
  stdio: 'inherit',
});
process.exit(vitest.status ?? 1);
