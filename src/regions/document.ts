/**
 * Reads a region file (YAML or JSON text, or an already parsed object) into a
 * {@link RegionDocument}: shapes validated, degrees turned into radians,
 * references between named regions checked for unknown names and cycles.
 * Every problem is one {@link InputError} line naming the key path.
 */
import { didYouMean } from '../core/didYouMean.js';
import { parse as parseYaml, YAMLParseError } from 'yaml';
import { InputError } from '../core/errors.js';
import { degToRad } from '../sphere/angles.js';
import type { CatalogueColumns, RegionDocument, RegionNode, ShapeFrame, SiteWeight } from './types.js';
import { checkWith, COMBINATOR_KEYS, describeValue, documentSchema, REGION_EXTRA_KEYS, shapeSchemas } from './schema.js';

type Shapes = typeof shapeSchemas;
const SHAPE_KEYS = [...Object.keys(shapeSchemas), ...COMBINATOR_KEYS];
const ALL_KEYS = [...SHAPE_KEYS, ...REGION_EXTRA_KEYS];

/**
 * Parses a region document. `input` is YAML or JSON text, or a plain object
 * with the same structure; `file` is used in messages and to resolve the
 * relative paths of catalogues and exposure maps.
 *
 * @example
 * const doc = parseRegionDocument('regions:\n  plane:\n    band: { frame: galactic, absLatDeg: [0, 4] }\n');
 * doc.regions.get('plane')?.kind // 'band'
 */
export function parseRegionDocument(input: string | unknown, file?: string): RegionDocument {
  let data: unknown = input;
  if (typeof input === 'string') {
    try {
      data = parseYaml(input);
    } catch (e) {
      if (e instanceof YAMLParseError) {
        const line = e.linePos?.[0]?.line;
        throw new InputError(`not valid YAML or JSON${line ? ` at line ${line}` : ''}: ${e.message.split('\n')[0]}`, { file });
      }
      throw e;
    }
  }
  if (data === null || typeof data !== 'object' || Array.isArray(data)) {
    throw new InputError(`found ${describeValue(data)}, expected a document with a 'regions' map`, { file, keyPath: '(top)' });
  }
  const top = checkWith(documentSchema, data, '', file);
  const docFrame = top.frame as ShapeFrame | undefined;
  const regions = new Map<string, RegionNode>();
  for (const [name, value] of Object.entries(top.regions)) {
    regions.set(name, parseNode(value, `regions.${name}`, docFrame, file));
  }
  const doc: RegionDocument = { file, regions, source: data };
  checkReferences(doc);
  return doc;
}

function parseItems(value: unknown, keyPath: string, docFrame: ShapeFrame | undefined, file: string | undefined, allowSingle: boolean): RegionNode[] {
  if (!Array.isArray(value)) {
    if (allowSingle) return [parseNode(value, keyPath, docFrame, file)];
    throw new InputError(`found ${describeValue(value)}, expected a list of regions (names or shapes)`, { file, keyPath });
  }
  if (value.length === 0) throw new InputError('found an empty list, expected at least one region', { file, keyPath });
  return value.map((v, i) => parseNode(v, `${keyPath}[${i}]`, docFrame, file));
}

function parseNode(value: unknown, keyPath: string, docFrame: ShapeFrame | undefined, file: string | undefined): RegionNode {
  if (typeof value === 'string') {
    if (!/^[A-Za-z][A-Za-z0-9_-]*$/.test(value)) {
      throw new InputError(`found ${describeValue(value)}, expected the name of a region`, { file, keyPath });
    }
    return { kind: 'ref', name: value, keyPath, except: [] };
  }
  if (value === null || typeof value !== 'object' || Array.isArray(value)) {
    throw new InputError(`found ${describeValue(value)}, expected a region (a name or an object with one shape key)`, { file, keyPath });
  }
  const obj = value as Record<string, unknown>;
  const keys = Object.keys(obj);
  for (const k of keys) {
    if (!ALL_KEYS.includes(k)) {
      throw new InputError(`found unknown key '${k}', expected one of: ${ALL_KEYS.join(', ')}`, { file, keyPath: `${keyPath}.${k}` }, didYouMean(k, ALL_KEYS) || undefined);
    }
  }
  const shapes = keys.filter((k) => SHAPE_KEYS.includes(k));
  if (shapes.length !== 1) {
    throw new InputError(shapes.length === 0
      ? `found no shape key, expected exactly one of: ${SHAPE_KEYS.join(', ')}`
      : `found shape keys ${shapes.join(' and ')}, expected exactly one (combine shapes with all or any)`, { file, keyPath });
  }
  if (obj.about !== undefined && typeof obj.about !== 'string') {
    throw new InputError(`found ${describeValue(obj.about)}, expected a text`, { file, keyPath: `${keyPath}.about` });
  }
  const except = obj.except === undefined ? [] : parseItems(obj.except, `${keyPath}.except`, docFrame, file, true);
  const key = shapes[0];
  const path = `${keyPath}.${key}`;
  if (key === 'all' || key === 'any') {
    return { kind: key, items: parseItems(obj[key], path, docFrame, file, false), keyPath, except };
  }
  const node = parseShape(key as keyof Shapes, obj[key], path, docFrame, file);
  return { ...node, keyPath, except } as RegionNode;
}

function frameOf(given: string | undefined, docFrame: ShapeFrame | undefined, path: string, file: string | undefined): ShapeFrame {
  const f = (given ?? docFrame) as ShapeFrame | undefined;
  if (!f) {
    throw new InputError('found no frame, expected frame: galactic or equatorial here or at the top of the file', { file, keyPath: `${path}.frame` });
  }
  return f;
}

type ShapeOnly = Omit<RegionNode, 'keyPath' | 'except'> | Record<string, unknown>;

function parseShape(key: keyof Shapes, value: unknown, path: string, docFrame: ShapeFrame | undefined, file: string | undefined): ShapeOnly {
  switch (key) {
    case 'sky':
      checkWith(shapeSchemas.sky, value, path, file);
      return { kind: 'sky' };
    case 'site': {
      const s = checkWith(shapeSchemas.site, value, path, file);
      let weight: SiteWeight;
      if (s.weight === undefined || s.weight === 'none') weight = { kind: 'none' };
      else if (typeof s.weight === 'string') weight = { kind: s.weight };
      else weight = { kind: 'map', file: s.weight.map, column: s.weight.column, frame: s.weight.frame };
      return { kind: 'site', latRad: degToRad(s.latDeg), maxZenithRad: degToRad(s.maxZenithDeg), weight };
    }
    case 'box': {
      const s = checkWith(shapeSchemas.box, value, path, file);
      let from = 0, width = 360;
      if (s.lonDeg) {
        from = s.lonDeg[0];
        width = s.lonDeg[1] - s.lonDeg[0];
        if (width < 0) width += 360;
      }
      const lat = s.latDeg ?? [-90, 90];
      return {
        kind: 'box', frame: frameOf(s.frame, docFrame, path, file), lonFromRad: degToRad(((from % 360) + 360) % 360),
        lonWidthRad: degToRad(width), latMinRad: degToRad(lat[0]), latMaxRad: degToRad(lat[1]),
      };
    }
    case 'band': {
      const s = checkWith(shapeSchemas.band, value, path, file);
      return { kind: 'band', frame: frameOf(s.frame, docFrame, path, file), absLatMinRad: degToRad(s.absLatDeg[0]), absLatMaxRad: degToRad(s.absLatDeg[1]) };
    }
    case 'disc': {
      const s = checkWith(shapeSchemas.disc, value, path, file);
      return { kind: 'disc', frame: frameOf(s.frame, docFrame, path, file), lonRad: degToRad(s.atDeg[0]), latRad: degToRad(s.atDeg[1]), radiusRad: degToRad(s.radiusDeg) };
    }
    case 'ring': {
      const s = checkWith(shapeSchemas.ring, value, path, file);
      return {
        kind: 'ring', frame: frameOf(s.frame, docFrame, path, file), lonRad: degToRad(s.atDeg[0]), latRad: degToRad(s.atDeg[1]),
        innerRad: degToRad(s.radiiDeg[0]), outerRad: degToRad(s.radiiDeg[1]),
      };
    }
    case 'sources': {
      const s = checkWith(shapeSchemas.sources, value, path, file);
      if ((s.psfDeg === undefined) !== (s.psfTimes === undefined)) {
        throw new InputError(`found only ${s.psfDeg === undefined ? 'psfTimes' : 'psfDeg'}, expected psfDeg and psfTimes together`,
          { file, keyPath: `${path}.${s.psfDeg === undefined ? 'psfDeg' : 'psfTimes'}` });
      }
      const columns: CatalogueColumns = { name: 'name', lon: 'lon', lat: 'lat', frame: 'frame', radius: 'radius', ...s.columns };
      return {
        kind: 'sources', file: s.file, frame: (s.frame ?? docFrame ?? null) as ShapeFrame | null,
        defaultRadiusRad: s.radiusDeg === undefined ? null : degToRad(s.radiusDeg),
        growth: s.psfDeg === undefined ? null : { psfRad: degToRad(s.psfDeg), times: s.psfTimes as number }, columns,
      };
    }
  }
}

function forEachRef(node: RegionNode, visit: (ref: RegionNode & { kind: 'ref' }) => void): void {
  if (node.kind === 'ref') visit(node);
  if (node.kind === 'all' || node.kind === 'any') for (const c of node.items) forEachRef(c, visit);
  for (const c of node.except) forEachRef(c, visit);
}

function checkReferences(doc: RegionDocument): void {
  const names = [...doc.regions.keys()];
  for (const node of doc.regions.values()) {
    forEachRef(node, (ref) => {
      if (!doc.regions.has(ref.name)) {
        throw new InputError(`found unknown region '${ref.name}', expected one of: ${names.join(', ')}`, { file: doc.file, keyPath: ref.keyPath }, didYouMean(ref.name, names) || undefined);
      }
    });
  }
  const state = new Map<string, 1 | 2>();
  const chain: string[] = [];
  const visit = (name: string, keyPath: string): void => {
    if (state.get(name) === 2) return;
    if (state.get(name) === 1) {
      const cycle = [...chain.slice(chain.indexOf(name)), name].join(' -> ');
      throw new InputError(`found a cycle ${cycle}, expected regions that do not refer back to themselves`, { file: doc.file, keyPath });
    }
    state.set(name, 1);
    chain.push(name);
    forEachRef(doc.regions.get(name) as RegionNode, (ref) => visit(ref.name, ref.keyPath));
    chain.pop();
    state.set(name, 2);
  };
  for (const name of names) visit(name, `regions.${name}`);
}

/** The names of the regions of a document, in file order. */
export function regionNames(doc: RegionDocument): string[] {
  return [...doc.regions.keys()];
}
