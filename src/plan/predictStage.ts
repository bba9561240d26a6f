/**
 * The factors a run hands to the compare layer: per template, k_I over the
 * template's energy planes (a per-energy table when the planes carry
 * energies, one number otherwise) and the mean survival probability in the
 * measured region at every gamma-ray energy the run uses. The compare layer
 * reads both at each gamma-ray energy (compare/ensemble.ts: log-log between
 * tabulated energies, an error beyond them), inside the Monte Carlo and in the
 * proton fit, so one prediction covers every energy.
 */
import { buildEnsemble, ensembleAt, type TemplateFactor } from '../compare/ensemble.js';
import type { FactorResult } from '../scaling/ensembleFactors.js';

/** Survival of one region: per template, at each gamma-ray energy. */
export interface SurvivalTable { region: string; exposureWeighted: boolean; energiesGeV: number[]; byTemplate: Record<string, number[]> }

/** A template as this stage needs it: its name and its planes' energies (null or one plane: energy-independent). */
export interface StageTemplate { name: string; map: { energiesGeV: Float64Array | null; planes: readonly unknown[] } }

/**
 * Per-template factors to `target` from the factor rows, with survival tables
 * when given. Notes say when a template has several planes without energies
 * (plane 0 is used then).
 */
export function factorTables(templates: readonly StageTemplate[], fr: FactorResult, target: string, surv: SurvivalTable | null,
  weights: Record<string, number> | undefined): { factors: TemplateFactor[]; notes: string[] } {
  const notes: string[] = [];
  const factors = templates.map((t): TemplateFactor => {
    const rows = fr.rows.filter((r) => r.template === t.name && r.target === target).sort((a, b) => a.plane - b.plane);
    const e = t.map.energiesGeV;
    const base: TemplateFactor = { template: t.name };
    if (e && e.length > 1 && rows.length === e.length) base.kIByEnergy = { energiesGeV: Array.from(e), values: rows.map((r) => r.kI) };
    else {
      if (rows.length > 1) notes.push(`template '${t.name}': ${rows.length} planes without energies; plane 1 used at every energy`);
      base.kI = rows[0].kI;
    }
    if (surv) base.survivalByEnergy = { energiesGeV: surv.energiesGeV, values: surv.byTemplate[t.name] };
    if (weights) base.weight = weights[t.name];
    return base;
  });
  return { factors, notes };
}

/** The factors read at one gamma-ray energy, as single numbers (for results.json and the report). */
export function factorsAtEnergy(factors: readonly TemplateFactor[], gammaEnergyGeV: number): TemplateFactor[] {
  const ens = buildEnsemble(factors);
  const at = ensembleAt(ens, [gammaEnergyGeV]);
  return factors.map((f, t) => ({ template: f.template, kI: at.kI[t],
    ...(ens.hasSurvival ? { survivalMean: at.survival[t] } : {}), ...(f.weight !== undefined ? { weight: f.weight } : {}) }));
}
