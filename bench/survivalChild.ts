/**
 * Child process of bench/survival.ts: reduces one survival map over a region
 * (whole or streamed, argv[2]) and prints JSON with the peak RSS before the
 * reduction (template and region weights held) and after it.
 */
import { readSkyMap } from '../src/io/mapFile.js';
import { streamRegionSurvival, wholeRegionSurvival } from '../src/plan/survivalStream.js';
import { evaluateRegion } from '../src/regions/evaluate.js';
import { parseRegionDocument } from '../src/regions/document.js';

const [mode, survivalFile, templateFile] = process.argv.slice(2);
const doc = parseRegionDocument('frame: galactic\nregions:\n  patch:\n    box: { lonDeg: [20, 110], latDeg: [-6, 6] }\n', 'bench-regions.yaml');
const template = readSkyMap(templateFile);
const w = evaluateRegion(doc, 'patch', { nside: template.nside, frame: 'galactic', mode: 'centre' });
const before = process.resourceUsage().maxRSS * 1024;
const t0 = performance.now();
const r = mode === 'whole' ? wholeRegionSurvival(survivalFile, template, () => w, false)
  : await streamRegionSurvival(survivalFile, template, () => w, false);
const seconds = (performance.now() - t0) / 1e3;
console.log(JSON.stringify({ before, after: process.resourceUsage().maxRSS * 1024, seconds, first: r.survival[0] }));
