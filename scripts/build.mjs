// The build, as `npm run build` and the `prepare` script run it (and the tests
// and benchmarks that need the compiled command): tsc compiles the library
// into dist/, then bundle-cli.mjs bundles the command line into dist/bin/.
import { execFileSync } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
execFileSync(process.execPath, [join(root, 'node_modules/typescript/bin/tsc'), '-p', 'tsconfig.build.json'], { cwd: root, stdio: 'inherit' });
await import('./bundle-cli.mjs');
