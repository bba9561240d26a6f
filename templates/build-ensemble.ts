/**
 * Rebuilds the shipped ensemble: every templates/<name>.yaml becomes
 * templates/<name>.fits.gz (Nside 128, RING, Galactic, one plane, float32 with
 * 15 mantissa bits), and docs/templates.md lists what each assumes.
 * Run: npm run templates   (add --only NAME to rebuild one)
 */
import { statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { writeFileAtomic } from '../src/io/atomicWrite.js';
import { readTemplateSpec } from '../src/templates/readSpecFile.js';
import { buildShippedTemplate, ENSEMBLE_NSIDE, shippedEnsembleDir, shippedTemplateNames } from '../src/templates/ensemble.js';
import { writeTemplate } from '../src/templates/writeTemplate.js';
import { ensembleTable } from '../src/templates/ensembleTable.js';

const dir = shippedEnsembleDir();
const only = process.argv.includes('--only') ? process.argv[process.argv.indexOf('--only') + 1] : undefined;
const names = shippedTemplateNames(dir).filter((n) => !only || n === only);
let total = 0;
for (const name of names) {
  const t0 = Date.now();
  const spec = readTemplateSpec(join(dir, `${name}.yaml`));
  const built = await buildShippedTemplate(spec);
  const file = join(dir, `${name}.fits.gz`);
  writeTemplate(file, built, { force: true, dtype: 'float32' });
  const size = statSync(file).size;
  total += size;
  process.stderr.write(`${name}: Nside ${ENSEMBLE_NSIDE}, ${(size / 1024).toFixed(0)} KiB, ${((Date.now() - t0) / 1000).toFixed(1)} s\n`);
}
process.stderr.write(`total ${(total / 1048576).toFixed(2)} MiB\n`);
if (!only) {
  const specs = shippedTemplateNames(dir).map((n) => readTemplateSpec(join(dir, `${n}.yaml`)));
  writeFileAtomic(resolve(dir, '..', 'docs', 'templates.md'), ensembleTable(specs), { force: true });
}
