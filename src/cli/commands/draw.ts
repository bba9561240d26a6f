/**
 * `skyspan draw`: draws one plane of a HEALPix map file as a PNG picture
 * (Mollweide, or a zoomed longitude/latitude window), with region outlines or
 * hatched masks from a region file.
 */
import { resolve } from 'node:path';
import type { Command } from 'commander';
import { UsageError } from '../../core/errors.js';
import { readSkyMap } from '../../io/mapFile.js';
import { writeFileAtomic, checkWritable } from '../../io/atomicWrite.js';
import { evaluateRegion } from '../../regions/evaluate.js';
import { renderSkyMap, type ZoomWindowDeg } from '../../render/skyImage.js';
import { isColourMapName } from '../../render/colourMap.js';
import type { RegionOverlay } from '../../render/overlays.js';
import type { CliIo } from '../main.js';
import { readRegionFile } from '../options.js';

interface Options {
  out: string; column?: string; plane: string; scale: string; min?: string; max?: string; softening?: string;
  colours: string; frame?: string; mapFrame?: string; viewLon: string; regions?: string; outline?: string; shade?: string;
  regionNside: string; width: string; zoom?: string; title?: string; unit?: string; graticule: boolean; force?: boolean; json?: boolean;
}

function num(name: string, v: string): number {
  const n = Number(v);
  if (v.trim() === '' || !Number.isFinite(n)) throw new UsageError(`${name} is '${v}', expected a number`);
  return n;
}

function int(name: string, v: string): number {
  const n = num(name, v);
  if (!Number.isInteger(n)) throw new UsageError(`${name} is '${v}', expected a whole number`);
  return n;
}

/** Parses 'l1,l2,b1,b2' (deg); l2 <= l1 means the window passes l = 0 (e.g. 330,30 is 330..390). */
export function parseZoom(v: string): ZoomWindowDeg {
  const parts = v.split(',');
  if (parts.length !== 4) throw new UsageError(`--zoom is '${v}', expected l1,l2,b1,b2 in degrees, e.g. --zoom -40,60,-10,10`);
  const [l1, l2raw, b1, b2] = parts.map((p) => num('--zoom', p));
  const l2 = l2raw > l1 ? l2raw : l2raw + 360;
  if (!(b2 > b1 && b1 >= -90 && b2 <= 90)) throw new UsageError(`--zoom latitudes ${b1},${b2} are not -90 <= b1 < b2 <= 90`);
  return { lonMinDeg: l1, lonMaxDeg: l2, latMinDeg: b1, latMaxDeg: b2 };
}

function frameOption(name: string, v: string | undefined): 'galactic' | 'equatorial' | undefined {
  if (v === undefined) return undefined;
  if (v !== 'galactic' && v !== 'equatorial') throw new UsageError(`${name} is '${v}', expected galactic or equatorial`);
  return v;
}

function overlays(file: string, names: string | undefined, nside: number): RegionOverlay[] {
  if (!names) return [];
  const doc = readRegionFile(file);
  // Depth 2 (16 sub-pixels per pixel) is ample for the fraction > 0.5 boundary that is drawn.
  return names.split(',').map((n) => n.trim()).filter((n) => n).map((name) => {
    const w = evaluateRegion(doc, name, { nside, frame: 'galactic', mode: 'fraction', depth: 2 });
    return { name, nside: w.nside, frame: w.frame, fraction: w.fraction };
  });
}

function action(mapFile: string, o: Options, io: CliIo): void {
  const scale = o.scale;
  if (scale !== 'linear' && scale !== 'log' && scale !== 'asinh') throw new UsageError(`--scale is '${scale}', expected linear, log or asinh`);
  if (!isColourMapName(o.colours)) throw new UsageError(`--colours is '${o.colours}', expected magma, viridis, cividis or inferno`);
  if ((o.outline || o.shade) && !o.regions) throw new UsageError('--outline and --shade name regions of a file given with --regions');
  const frame = frameOption('--frame', o.frame), mapFrame = frameOption('--map-frame', o.mapFrame);
  const inputs = [resolve(mapFile), ...(o.regions ? [resolve(o.regions)] : [])];
  checkWritable(o.out, { force: o.force, inputs });
  const column = o.column === undefined ? undefined : /^\d+$/.test(o.column) ? Number(o.column) : o.column;
  const map = readSkyMap(mapFile, { column, frame: mapFrame });
  const regionNside = int('--region-nside', o.regionNside);
  const t0 = Date.now();
  const img = renderSkyMap(map, {
    width: int('--width', o.width), plane: int('--plane', o.plane) - 1, scale,
    min: o.min === undefined ? undefined : num('--min', o.min), max: o.max === undefined ? undefined : num('--max', o.max),
    softening: o.softening === undefined ? undefined : num('--softening', o.softening),
    colourMap: o.colours, frame, viewLonDeg: num('--view-lon', o.viewLon), zoom: o.zoom ? parseZoom(o.zoom) : undefined,
    graticule: o.graticule, title: o.title, unit: o.unit,
    outlines: o.regions ? overlays(o.regions, o.outline, regionNside) : [],
    shades: o.regions ? overlays(o.regions, o.shade, regionNside) : [],
  });
  writeFileAtomic(o.out, img.png, { force: o.force, inputs });
  const summary = {
    map: mapFile, column: map.column, plane: int('--plane', o.plane), output: o.out, width: img.width, height: img.height,
    frame: img.displayFrame, scale: img.scale.kind, min: img.scale.min, max: img.scale.max, colours: img.lut.name,
    blankPixels: img.blankPixels, seconds: (Date.now() - t0) / 1000,
  };
  if (o.json) { io.out(JSON.stringify(summary, null, 2) + '\n'); return; }
  io.out(`drew ${mapFile} (${map.column}, plane ${summary.plane}) to ${o.out}: ${img.width}x${img.height} px, ${img.displayFrame} frame, `
    + `${img.scale.kind} scale ${img.scale.min.toPrecision(4)} .. ${img.scale.max.toPrecision(4)}\n`);
}

/** Registers `skyspan draw`. */
export function register(program: Command, io: CliIo): void {
  program.command('draw')
    .description('draw a HEALPix map file as a PNG picture (Mollweide or a zoomed window) with regions outlined')
    .argument('<map>', 'map file (FITS, .fits.gz)')
    .requiredOption('-o, --out <file>', 'PNG file to write')
    .option('--column <name|n>', 'map column by name or 1-based number (default: the first)')
    .option('--plane <n>', 'energy plane, 1-based', '1')
    .option('--scale <kind>', 'colour scale: linear, log or asinh', 'linear')
    .option('--min <value>', 'value at the bottom of the colour bar (default: from the data)')
    .option('--max <value>', 'value at the top of the colour bar (default: from the data)')
    .option('--softening <value>', 'asinh softening in map units (default: 1/20 of the largest |value|)')
    .option('--colours <name>', 'colour map: magma, viridis, cividis or inferno', 'magma')
    .option('--frame <frame>', 'display frame: galactic or equatorial (default: the map\'s)')
    .option('--map-frame <frame>', 'frame of the map when the file does not say (no COORDSYS)')
    .option('--view-lon <deg>', 'longitude in the middle of a Mollweide picture', '0')
    .option('--regions <file>', 'region file (YAML or JSON) for --outline and --shade')
    .option('--outline <names>', 'comma-separated regions to outline (boundary of covered fraction > 0.5)')
    .option('--shade <names>', 'comma-separated regions to hatch (e.g. masked sources)')
    .option('--region-nside <n>', 'HEALPix Nside at which regions are evaluated for drawing', '256')
    .option('--width <px>', 'picture width in pixels (300 to 8000)', '1200')
    .option('--zoom <l1,l2,b1,b2>', 'draw the longitude/latitude window (deg) in a plate carree view instead')
    .option('--title <text>', 'title above the picture')
    .option('--unit <text>', 'colour-bar label (default: the map\'s unit; ^ marks superscripts)')
    .option('--no-graticule', 'leave out the coordinate grid')
    .option('--force', 'replace an existing output file')
    .option('--json', 'print a summary as JSON')
    .addHelpText('after', '\nExamples:\n  skyspan draw template.fits.gz -o plane.png --scale log --regions regions.yaml --outline survey --shade sources\n'
      + '  skyspan draw template.fits.gz -o zoom.png --zoom -40,60,-10,10 --scale asinh --frame galactic\n')
    .action((mapFile: string, o: Options) => action(mapFile, o, io));
}
