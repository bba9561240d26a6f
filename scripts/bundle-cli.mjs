// Bundles the command line into dist/bin/ (the second step of scripts/build.mjs,
// after tsc has compiled the library into dist/).
//
// Why: a command's module graph is about a hundred of our files plus zod's and
// yaml's own, and Node resolves, reads and compiles each one at every run; the
// bundle turns that into a few files (`skyspan factors --help`: 0.34 s -> 0.24 s
// whole process on the 2-core machine, README "Design"). esbuild splits the
// bundle at each command's dynamic import, so `--version` and `--help` still
// load no command and no heavy package. mathjs stays a separate package: it is
// required lazily (core/lazyRequire.ts) only for unusual unit strings.
//
// Entry points are flat in dist/bin/ because the code finds its workers beside
// itself (new URL('./main.js' | './losWorker.js' | './templateWorker.js',
// import.meta.url)) and the shipped templates two folders up. dist/bin/meta.json
// lists, for every output file, the source files and packages inside it, so the
// tests can say which packages a run loaded.
import { build } from 'esbuild';
import { writeFileSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const outdir = join(root, 'dist/bin');
const result = await build({
  absWorkingDir: root,
  entryPoints: ['src/cli/program.ts', 'src/cli/main.ts', 'src/templates/losWorker.ts', 'src/scaling/templateWorker.ts'],
  entryNames: '[name]',
  chunkNames: 'chunk-[hash]',
  bundle: true,
  splitting: true,
  format: 'esm',
  platform: 'node',
  target: 'node20',
  outdir,
  external: ['mathjs'],
  sourcemap: 'linked',
  metafile: true,
  logLevel: 'warning',
  // bundled CommonJS packages (pngjs, cli-progress) call require() for Node's own modules
  banner: { js: "import { createRequire as __skyspanRequire } from 'node:module'; const require = __skyspanRequire(import.meta.url);" },
});

const packageOf = (input) => /node_modules\/((?:@[^/]+\/)?[^/]+)/.exec(input)?.[1] ?? null;
const outputs = {};
for (const [file, out] of Object.entries(result.metafile.outputs)) {
  if (file.endsWith('.map')) continue;
  const inputs = Object.keys(out.inputs);
  outputs[relative(outdir, join(root, file))] = {
    packages: [...new Set(inputs.map(packageOf).filter(Boolean))].sort(),
    sources: inputs.filter((i) => !packageOf(i)).sort(),
  };
}
writeFileSync(join(outdir, 'meta.json'), JSON.stringify({ outputs }, null, 1) + '\n');
