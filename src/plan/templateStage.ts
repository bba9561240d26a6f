/**
 * The templates of a run and their survival maps. Template files are read as
 * given; specs are built at `buildNside` (with absorption when asked, the
 * absorbed map divided by its survival map to get the intrinsic template the
 * factors need); the shipped ensemble is read from templates/ and, for
 * absorption, each of its specs is built again at `absorptionNside` with
 * absorption at the gamma-ray energies in use. Builds go through the cache.
 */
import { existsSync } from 'node:fs';
import { InputError } from '../core/errors.js';
import { sha256File } from '../io/hash.js';
import { createSkyMap } from '../maps/create.js';
import type { SkyMap } from '../maps/skyMap.js';
import { listTemplateFiles, readTemplateFiles } from '../scaling/templateFiles.js';
import { buildTemplate, type BuiltTemplate } from '../templates/buildTemplate.js';
import { loadShippedEnsemble } from '../templates/ensemble.js';
import { readTemplateSpec } from '../templates/readSpecFile.js';
import type { TemplateSpec } from '../templates/templateSpec.js';
import { survivalPathFor } from '../templates/writeTemplate.js';
import type { ArtefactCache } from './cache.js';

/** One template of the run: the intrinsic map for the factors, and an absorbed map with its survival map, if any. */
export interface RunTemplate {
  name: string;
  map: SkyMap;
  /** Absorbed template (emission x survival) and survival map on one grid, with energies; null without absorption or with `survivalFile`. */
  absorbed: { tAbs: SkyMap; survival: SkyMap } | null;
  /** With absorption, a template file's survival map beside it: streamed over each region when needed (survivalStream.ts), never held. */
  survivalFile?: string;
  /** Where it came from: a file, a spec file, or 'shipped'. */
  origin: { kind: 'file' | 'spec' | 'shipped'; path: string; sha256: string };
  /** Its source's place among the run's template sources (files, then specs, then shipped; from 0) and its place within that source (map column). */
  source?: { index: number; ordinal: number };
}

function mapToEntry(m: SkyMap) {
  return { meta: { nside: m.nside, ordering: m.ordering, frame: m.frame, column: m.column, unit: m.unit,
    energiesGeV: m.energiesGeV ? Array.from(m.energiesGeV) : null }, arrays: m.planes.map((p) => Float64Array.from(p)) };
}
function entryToMap(meta: unknown, arrays: (Float32Array | Float64Array)[]): SkyMap {
  const m = meta as { nside: number; ordering: 'RING' | 'NESTED'; frame: 'galactic'; column: string; unit: string; energiesGeV: number[] | null };
  return createSkyMap({ nside: m.nside, ordering: m.ordering, frame: m.frame, column: m.column, unit: m.unit, planes: arrays,
    energiesGeV: m.energiesGeV ? Float64Array.from(m.energiesGeV) : null });
}

/** Map files named by `paths` (folders expanded), without the survival maps that sit beside templates. */
export function templateFileList(paths: string[]): string[] {
  return listTemplateFiles(paths).filter((f) => paths.includes(f) || !/-survival\.(fits|fit|fts)(\.gz)?$/i.test(f));
}

/**
 * Builds a spec through the cache: the built map is a `template` entry and,
 * with absorption, its survival map a `survival` entry under the same
 * parameters; a missing or discarded entry of either rebuilds both and
 * stores the ones that were not found.
 */
export async function cachedBuild(spec: TemplateSpec, opts: { nside: number; energiesGeV?: number[]; absorption: boolean },
  cache: ArtefactCache): Promise<BuiltTemplate> {
  const parts = { spec, ...opts };
  const tKey = cache.key('template', parts), sKey = cache.key('survival', parts);
  const label = `template ${spec.name} at Nside ${opts.nside}${opts.absorption ? ' with absorption' : ''}`;
  const sLabel = `survival of ${spec.name} at Nside ${opts.nside}`;
  const tHit = cache.get('template', tKey, label);
  const sHit = opts.absorption ? cache.get('survival', sKey, sLabel) : null;
  if (tHit && (sHit || !opts.absorption)) {
    return { map: entryToMap(tHit.meta, tHit.arrays), survival: sHit ? entryToMap(sHit.meta, sHit.arrays) : null };
  }
  const built = await buildTemplate(spec, { nside: opts.nside, energiesGeV: opts.energiesGeV, absorption: opts.absorption });
  if (!tHit) cache.put('template', tKey, label, mapToEntry(built.map));
  if (opts.absorption && !sHit && built.survival) cache.put('survival', sKey, sLabel, mapToEntry(built.survival));
  return built;
}

/** Intrinsic template = absorbed / survival (pixels with survival 0 stay 0). */
function intrinsic(built: BuiltTemplate): SkyMap {
  const s = built.survival!;
  const planes = built.map.planes.map((p, e) => Float64Array.from(p, (v, i) => (s.planes[e][i] > 0 ? v / s.planes[e][i] : 0)));
  return { ...built.map, planes };
}

/** Loads every template of the run (see module comment). `gammaEnergiesGeV` are the energies survival is needed at. */
export async function loadRunTemplates(opts: {
  files: string[]; specs: string[]; shipped: boolean; buildNside: number; absorptionNside: number;
  absorption: boolean; gammaEnergiesGeV: number[]; frame?: 'galactic' | 'equatorial'; planFile?: string;
  /** Loads only the sources for which this is true (by index, see {@link RunTemplate.source}); default all. */
  select?: (source: number) => boolean;
}, cache: ArtefactCache): Promise<{ templates: RunTemplate[]; notes: string[] }> {
  const out: RunTemplate[] = [], notes: string[] = [];
  const energies = [...opts.gammaEnergiesGeV];
  const select = opts.select ?? (() => true);
  const fileList = opts.files.length ? templateFileList(opts.files) : [];
  if (opts.files.length) {
    const ordinals = new Map<string, number>();
    for (const t of readTemplateFiles(fileList.filter((_, i) => select(i)), { frame: opts.frame })) {
      const ordinal = ordinals.get(t.file) ?? 0;
      ordinals.set(t.file, ordinal + 1);
      let survivalFile: string | undefined;
      if (opts.absorption) {
        const sp = survivalPathFor(t.file);
        if (!existsSync(sp)) {
          throw new InputError(`template file ${t.file} has no survival map beside it (${sp})`, { file: opts.planFile, keyPath: 'templates.files' },
            'build it with absorption (skyspan build --absorption), name its spec under templates.build, or set methods.absorption: none');
        }
        survivalFile = sp;
        notes.push(`template '${t.name}': survival from ${sp}`);
      }
      out.push({ name: t.name, map: t.map, absorbed: null, ...(survivalFile ? { survivalFile } : {}), origin: { kind: 'file', path: t.file, sha256: t.sha256 },
        source: { index: fileList.indexOf(t.file), ordinal } });
    }
  }
  for (const [j, path] of opts.specs.entries()) {
    if (!select(fileList.length + j)) continue;
    const spec = readTemplateSpec(path);
    const built = await cachedBuild(spec, { nside: opts.buildNside, energiesGeV: opts.absorption ? energies : spec.energiesGeV, absorption: opts.absorption }, cache);
    const map = opts.absorption ? intrinsic(built) : built.map;
    out.push({ name: spec.name, map, absorbed: opts.absorption ? { tAbs: built.map, survival: built.survival! } : null,
      origin: { kind: 'spec', path, sha256: sha256File(path) }, source: { index: fileList.length + j, ordinal: 0 } });
  }
  if (opts.shipped) {
    for (const [j, t] of loadShippedEnsemble().entries()) {
      const index = fileList.length + opts.specs.length + j;
      if (!select(index)) continue;
      let absorbed: RunTemplate['absorbed'] = null;
      if (opts.absorption) {
        const b = await cachedBuild(t.spec, { nside: opts.absorptionNside, energiesGeV: energies, absorption: true }, cache);
        absorbed = { tAbs: b.map, survival: b.survival! };
      }
      out.push({ name: t.name, map: t.map, absorbed, origin: { kind: 'shipped', path: t.file, sha256: sha256File(t.file) }, source: { index, ordinal: 0 } });
    }
    if (opts.absorption) notes.push(`shipped templates: survival maps built from their specs at Nside ${opts.absorptionNside} with CMB absorption at ${energies.map((e) => `${(e / 1e3).toPrecision(3)} TeV`).join(', ')}`);
  }
  return { templates: out, notes };
}
