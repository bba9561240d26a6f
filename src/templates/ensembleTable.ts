/**
 * The Markdown table of the shipped ensemble (docs/templates.md): what each
 * template assumes, generated from the spec files.
 */
import type { TemplateSpec } from './templateSpec.js';
import { ENSEMBLE_NSIDE } from './ensemble.js';

const GAS: Record<string, string> = {
  hiDickeyLockman: 'HI: Dickey & Lockman 1990 vertical profile (Ferriere 2001 eq. 8), flat 3.5 kpc to R_sun, exp(-(R - R_sun)/3.15 kpc) and flaring (9.8 kpc) outside',
  hiNakanishiSofue2003: 'HI: Nakanishi & Sofue 2003 analytic fit',
  h2Ferriere2001: 'H2: Ferriere 2001 eq. 3 (from memory, low confidence)',
  h2NakanishiSofue2006: 'H2: Nakanishi & Sofue 2006 analytic fit',
  uniform: 'uniform gas', exponentialSlab: 'exponential slab', expression: 'user expression',
};
const LAW: Record<string, string> = {
  lorimer2006: 'Lorimer et al. 2006 (a = 1.9, b = 5.0)', green2015: 'Green 2015 (a = 1.09, b = 3.87)',
  case1998: 'Case & Bhattacharya 1998 (a = 2.00, b = 3.53)', yusifov2004: 'Yusifov & Kucuk 2004', constant: 'uniform', expression: 'user expression',
};

const SPEC_KEYS = [
  '## Template spec keys',
  '',
  'A spec is a YAML file; `skyspan build SPEC -o out.fits.gz [--nside N] [--energies 100TeV,1PeV] [--absorption]` turns it into a map.',
  '',
  '| key | meaning |',
  '| --- | --- |',
  '| `name` | letters, digits, `.`, `-`, `_` |',
  '| `description` | free text |',
  '| `observer.rSunKpc`, `observer.zSunKpc` | the Sun\'s Galactocentric radius (default 8.5; 8.178 is the other common choice) and height (default 0) |',
  '| `gas[i].component` | `hiDickeyLockman` (options `holeRadiusKpc`, `holeScaleKpc`, `outerScaleKpc`, `flareScaleKpc`), `hiNakanishiSofue2003`, `h2Ferriere2001`, `h2NakanishiSofue2006`, `uniform` (`densityCm3`), `exponentialSlab` (`densityCm3`, `scaleHeightKpc`), `expression` (`expression`: mathjs in R and z, kpc, giving cm^-3) |',
  '| `gas[i].factor` | weight of the component (2 counts H2 molecules as nucleons) |',
  '| `cosmicRays.distribution` | `lorimer2006`, `green2015`, `case1998`, `yusifov2004` (need `haloHeightKpc`), `constant`, `expression` (with `cosmicRays.expression`) |',
  '| `cosmicRays.haloHeightKpc`, `cosmicRays.verticalProfile` | halo height H and `linear` (1 - abs(z)/H, default) or `exponential` (exp(-abs(z)/H)) |',
  '| `cosmicRays.indexGradientPerKpc`, `cosmicRays.pivotGeV` | radial change g of the spectral index: plane E is multiplied by (E/pivot)^(-g (R - R_sun)) |',
  '| `sources.distribution`, `sources.scaleHeightKpc` | source-density template: radial law x exp(-abs(z)/h) (instead of gas and cosmicRays); also `indexGradientPerKpc`, `pivotGeV` |',
  '| `energiesGeV` | plane energies (the command line may override) |',
  '| `integration.maxDistanceKpc`, `.stepKpc`, `.nodesPerSegment` | line of sight: 30 kpc, 0.5 kpc, 6 by default |',
];

const ACCURACY = [
  '## Accuracy of the line-of-sight integration',
  '',
  'Each line of sight is cut into segments that double in length from step/32 next to the observer up to the step,',
  'then stay at the step, with a Gauss-Legendre rule on each. The model is tabulated once in (R, u = z/(abs(z) + 0.5 kpc))',
  '(R every 0.025 kpc, 1025 u nodes: 1 pc spacing at the plane) in single precision and interpolated bilinearly.',
  'Pixels are sampled at their centres; below Nside 64 each pixel averages 4^k sub-pixels so that the effective Nside is 64.',
  '',
  'Error against a converged run (step 1/16 kpc, 8 nodes), all pixels of Nside 16, model HI (Dickey & Lockman) + 2 H2',
  '(Nakanishi & Sofue) x cosmic rays (Lorimer et al. 2006, H = 4 kpc), measured by `npx tsx bench/templatesConvergence.ts`:',
  '',
  '| step (kpc) | nodes | samples per line of sight | worst relative error | median |',
  '| --- | --- | --- | --- | --- |',
  '| 1 | 4 | 140 | 4.9e-4 | 1.4e-6 |',
  '| 0.5 | 4 | 260 | 1.1e-4 | 1.2e-6 |',
  '| **0.5** | **6** | **390** | **3.9e-5** | **1.0e-6** (default) |',
  '| 0.25 | 6 | 750 | 1.3e-5 | 1.0e-6 |',
  '| 0.125 | 4 | 980 | 8.5e-6 | 7.5e-7 |',
  '',
  'Halving the default step changes no pixel by more than 1e-4 (test). The worst pixels lie where the model has kinks',
  '(the edge of the HI hole, the Sun\'s circle, the halo boundary |z| = H). Checks against closed forms: uniform sphere',
  'n0 D (1e-12), exponential slab n0 h / sin b (1e-4), Dickey & Lockman pole column 3.1017e20 cm^-2 (1e-4), shell',
  'attenuation exp(-d/lambda) (1e-9). Shipped maps are rounded to 15 mantissa bits (1.5e-5 relative).',
  'Known limit: with z_sun other than 0 the crossing of the mid-plane falls inside a segment (the samples are the same',
  'for every pixel), which costs up to 2e-4 toward the poles for a thin exponential disc (test). User expressions are',
  'evaluated on a sub-grid (every 0.1 kpc in R, every 2nd u node) and interpolated, adding about 1e-5.',
];

/** The table as Markdown text. */
export function ensembleTable(specs: TemplateSpec[]): string {
  const rows = specs.map((s) => {
    const gas = s.gas ? s.gas.map((g) => `${GAS[g.component]}${g.factor !== 1 ? ` x ${g.factor} (nucleons)` : ''}`).join('; ') : '-';
    const cr = s.cosmicRays ? LAW[s.cosmicRays.distribution] : `sources: ${LAW[s.sources!.distribution]}`;
    const halo = s.cosmicRays?.haloHeightKpc !== undefined ? `${s.cosmicRays.haloHeightKpc} (${s.cosmicRays.verticalProfile})`
      : s.sources ? `scale height ${s.sources.scaleHeightKpc}` : '-';
    return `| ${s.name} | ${gas} | ${cr} | ${halo} | ${s.observer.rSunKpc} | ${s.sources ? 'kpc' : 'cm^-2'} |`;
  });
  return [
    '# Shipped templates',
    '',
    `Each template is a HEALPix map (Nside ${ENSEMBLE_NSIDE}, RING, Galactic l/b with l = 0 toward the Galactic centre, one plane, float32`,
    'rounded to 15 mantissa bits) made by `npm run templates` from its spec file in `templates/`. Gas templates are',
    'the line-of-sight integral, from the Sun to 30 kpc, of the gas density (H2 counted twice, as nucleons) times the',
    'cosmic-ray density relative to the Sun; the source template integrates a relative source density. No pair absorption',
    'and no spectral-index gradient: the maps are spatial shapes. Cosmic rays follow the named source law smoothed in the',
    'plane by a Gaussian of width equal to the halo height H and fall linearly to zero at |z| = H (a simple diffusion-halo',
    'model chosen here). Using a template to extrapolate assumes that the emission in the unseen sky has the template\'s shape,',
    'and, for neutrino predictions, that the emission is hadronic.',
    '',
    '| name | gas | cosmic-ray / source distribution | halo height H (kpc) | R_sun (kpc) | unit |',
    '| --- | --- | --- | --- | --- | --- |',
    ...rows,
    '',
    'Parameters marked "from memory" in the source (src/templates/) were not read in the papers.',
    '',
    ...SPEC_KEYS,
    '',
    ...ACCURACY,
    '',
  ].join('\n');
}
