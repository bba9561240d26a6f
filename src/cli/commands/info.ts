/**
 * `skyspan info FILE`: what a FITS file holds. Every HDU (kind, name, size,
 * columns and units); for a HEALPix map its Nside, ordering, frame, indexing,
 * energy planes, and per column and plane the min/mean/max of the non-blank
 * pixels, the blank count, and the fractions of the sky that are not blank
 * and that are non-zero (for a mask, the sky it covers at all). A file without
 * a HEALPix map is described, not refused. The file is streamed once, in
 * bounded memory whatever its size.
 */
import type { Command } from 'commander';
import { describeFitsFileStreamed, type DescribedMap, type StreamedDescription } from '../../io/fitsDescribeStream.js';
import type { CliIo } from '../main.js';

/** Per-plane figures shown by info. */
interface PlaneInfo {
  energyGeV: number | null; min: number; mean: number; max: number; blankCount: number; validCount: number;
  /** Fraction of the sky's pixels that are not blank. */
  validSkyFraction: number;
  /** Fraction of the sky's pixels with a non-zero value (for a mask: the sky it covers at all). */
  nonZeroSkyFraction: number;
}

function mapInfo(m: DescribedMap) {
  const planes: PlaneInfo[] = m.planes.map((s, k) => ({ energyGeV: m.energiesGeV ? m.energiesGeV[k] : null, min: s.min, mean: s.mean, max: s.max,
    blankCount: s.blankCount, validCount: s.validCount, validSkyFraction: s.validCount / m.pixels, nonZeroSkyFraction: s.nonZeroCount / m.pixels }));
  return { column: m.column, unit: m.unit, nside: m.nside, ordering: m.ordering, frame: m.frame,
    pixels: m.pixels, energiesGeV: m.energiesGeV ? Array.from(m.energiesGeV) : null, planes };
}

const g = (x: number): string => !Number.isFinite(x) ? 'n/a'
  : x !== 0 && (Math.abs(x) < 1e-3 || Math.abs(x) >= 1e6) ? x.toExponential(5) : String(Number(x.toPrecision(6)));

function text(d: StreamedDescription, maps: ReturnType<typeof mapInfo>[]): string {
  const lines = [`${d.file}: ${d.bytes} bytes, ${d.hdus.length} HDU${d.hdus.length === 1 ? '' : 's'}`];
  for (const h of d.hdus) {
    const size = h.kind === 'bintable' || h.kind === 'table' ? `${h.rows} rows of ${h.dims[0]} bytes`
      : h.dims.length ? `image ${h.dims.join(' x ')}` : 'no data';
    lines.push(`  HDU ${h.index} ${h.kind}${h.name ? ` ${h.name}` : ''}: ${size}`);
    for (const c of h.columns ?? []) lines.push(`    column ${c.name} (${c.format}${c.unit ? `, ${c.unit}` : ''})${c.note ? `: ${c.note}` : ''}`);
    if (h.healpix) {
      const x = h.healpix;
      lines.push(`    HEALPix map: Nside ${x.nside}, ${x.ordering}, frame ${x.frame}${x.coordsys ? ` (COORDSYS ${x.coordsys})` : ''}, ${x.scheme} indexing`);
    }
    for (const n of h.notes) lines.push(`    note: ${n}`);
  }
  if (maps.length === 0) lines.push('  no HEALPix map in this file');
  for (const m of maps) {
    const cube = m.energiesGeV ? `, ${m.planes.length} energy planes` : '';
    lines.push(`  map ${m.column}${m.unit ? ` [${m.unit}]` : ''}${cube}`);
    for (const [k, p] of m.planes.entries()) {
      // Planes are numbered from 1, with their energy when the file gives it.
      const e = m.planes.length > 1 || p.energyGeV !== null ? `plane ${k + 1}${p.energyGeV === null ? '' : ` at ${g(p.energyGeV)} GeV`}: ` : '';
      lines.push(`    ${e}min ${g(p.min)}, mean ${g(p.mean)}, max ${g(p.max)}; ${p.blankCount} blank of ${m.pixels}; not blank on ${(100 * p.validSkyFraction).toFixed(2)}% of the sky, non-zero on ${(100 * p.nonZeroSkyFraction).toFixed(2)}%`);
    }
  }
  return lines.join('\n') + '\n';
}

/** Registers `skyspan info`. */
export function register(program: Command, io: CliIo): void {
  program
    .command('info')
    .description('describe a FITS file: its HDUs and, for HEALPix maps, Nside, ordering, frame, columns and statistics')
    .argument('<file>', 'FITS file (.fits or .fits.gz)')
    .option('--json', 'print machine-readable JSON')
    .addHelpText('after', '\nExample:\n  skyspan info examples/demo/demo-map.fits --json\n')
    .action(async (file: string, opts: { json?: boolean }) => {
      const d = await describeFitsFileStreamed(file);
      const maps = d.maps.map(mapInfo);
      if (opts.json) io.out(JSON.stringify({ file: d.file, bytes: d.bytes, hdus: d.hdus, mapHdu: d.mapHdu, maps }, null, 2) + '\n');
      else io.out(text(d, maps));
    });
}
