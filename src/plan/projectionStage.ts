/**
 * The comparison on the neutrino template's own terms (plan keys
 * neutrino.template and neutrino.acceptance): each gamma-ray template's
 * predicted neutrino sky — the template scaled to the intensity measured in
 * the gamma-ray region, converted to neutrinos — is projected onto the
 * neutrino analysis's template by the acceptance-weighted least-squares
 * normalisation N = sum(a P T_nu) / sum(a T_nu^2) (scaling/templateProjection.ts),
 * through the projection factors q_t (scaling/projectionFactors.ts) that take
 * the place of k_I in the same Monte Carlo (same seed, samples, methods and
 * survival). The measured normalisation is read as multiplying the neutrino
 * template as stored: I_nu(pixel, E0) = N T_nu(pixel). The region-average
 * comparison stays the simple mode; this one is reported beside it.
 */
import { InputError } from '../core/errors.js';
import { readSkyMap } from '../io/mapFile.js';
import type { SkyMap } from '../maps/skyMap.js';
import type { SpectrumPoints } from '../physics/points.js';
import type { FactorResult } from '../scaling/ensembleFactors.js';
import { planeNearest, projectionFactors, type ProjectionFactor } from '../scaling/projectionFactors.js';
import type { TemplateFactor } from '../compare/ensemble.js';
import { predictNeutrinos, type PredictInput, type Prediction } from '../compare/predict.js';
import { compareAtReference, type ReferenceComparison } from '../compare/tension.js';
import type { ResolvedPlan } from './loadPlan.js';
import type { RunTemplate } from './templateStage.js';

/** The projection comparison of a run. */
export interface TemplateProjectionResult {
  templateFile: string;
  acceptanceFile: string | null;
  /** Per gamma-ray template: q_t beside its region-average k_I. */
  factors: (ProjectionFactor & { kI: number })[];
  /** The prediction of N at E0 (units of the measured normalisation per unit of T_nu). */
  prediction: Prediction;
  reference: ReferenceComparison | null;
  statement: string;
  notes: string[];
}

function readMap(path: string, rp: ResolvedPlan, keyPath: string): SkyMap {
  try {
    return readSkyMap(path, { frame: rp.plan.templates.frame });
  } catch (e) {
    if (e instanceof InputError) throw new InputError(e.problem, { ...e.location, file: e.location.file ?? path, keyPath }, 'paths are relative to the plan\'s folder');
    throw e;
  }
}

/** Runs the projection comparison (see module comment); null when the plan names no neutrino template. */
export function projectOnNeutrinoTemplate(a: {
  rp: ResolvedPlan; templates: RunTemplate[]; factors: FactorResult; factorsAtE0: TemplateFactor[];
  /** The prediction's factors (k_I and survival, per energy where known): q_t replaces k_I, the survival tables stay. */
  factorTables: readonly TemplateFactor[]; points: SpectrumPoints; e0GeV: number;
  base: Omit<PredictInput, 'factors' | 'e0GeV' | 'energiesNuGeV' | 'gamma'>;
}): TemplateProjectionResult | null {
  const { rp } = a;
  if (!rp.neutrinoTemplateFile) return null;
  const nu = readMap(rp.neutrinoTemplateFile, rp, 'neutrino.template');
  const acc = rp.acceptanceFile ? readMap(rp.acceptanceFile, rp, 'neutrino.acceptance') : null;
  const region = rp.plan.neutrino.region;
  const rows = a.templates.map((t) => {
    const f = a.factorsAtE0.find((x) => x.template === t.name)!;
    const candidates = a.factors.rows.filter((r) => r.template === t.name && r.target === region);
    const k = planeNearest(t.map, 2 * a.e0GeV); // the plane the region-average factors use (plan/compute.ts)
    const row = candidates.find((r) => r.plane === k) ?? candidates[0];
    return { t, f, row };
  });
  const proj = projectionFactors(rows.map(({ t, row }) => ({ name: t.name, map: t.map, plane: row.plane, meanMeasured: row.meanMeasured })), nu, acc, a.e0GeV);
  const factors = proj.map((p, i) => ({ ...p, plane: p.plane + 1, kI: rows[i].f.kI! })); // planes 1-based as users see them; factorsAtEnergy always sets kI
  const prediction = predictNeutrinos({ ...a.base, gamma: { kind: 'points', points: a.points }, e0GeV: a.e0GeV, energiesNuGeV: [],
    factors: rows.map(({ t }, i) => {
      const { kIByEnergy: _unused, ...f } = a.factorTables.find((x) => x.template === t.name)!;
      return { ...f, kI: proj[i].q };
    }), region: 'the neutrino template' });
  const m = rp.measurement;
  const notes: string[] = [];
  const reference = m.kind !== 'points' ? compareAtReference(prediction, m) : null;
  if (!reference) notes.push('template projection: a points measurement has no normalisation to compare N with; only the prediction of N is reported');
  const statement = `Template projection: each template's predicted neutrino sky (the template scaled to the intensity measured in '${rp.plan.gamma!.region}') ` +
    `was projected onto the neutrino template by the acceptance-weighted least-squares normalisation N = sum(a P T_nu) / sum(a T_nu^2) ` +
    `(acceptance ${acc ? 'from the acceptance map' : 'uniform'}); the measured normalisation is read as multiplying the neutrino template as stored.`;
  return { templateFile: rp.neutrinoTemplateFile, acceptanceFile: rp.acceptanceFile ?? null, factors, prediction, reference, statement, notes };
}
