/** The render layer's public API: sky-map PNGs, spectrum SVGs, the HTML report. */
export { renderSkyMap, type SkyImage, type SkyImageOptions, type ZoomWindowDeg } from './skyImage.js';
export { mollweideProjection, mollweideView, cartesianView, type SkyView } from './skyView.js';
export { colourLut, isColourMapName, type ColourLut, type ColourMapName } from './colourMap.js';
export { resolveScale, scaleTicks, type ScaleKind, type ValueScale } from './valueScale.js';
export type { RegionOverlay } from './overlays.js';
export { renderSpectrumSvg, type SpectrumSvgOptions } from './spectrumSvg.js';
export { pointsFromIntensity, type SpectrumPlotData, type SpectrumPointSet, type SpectrumBand } from './spectrumData.js';
export { renderReport, type ReportContent, type ReportTable, type ReportFigure, type KeyFigure } from './report.js';
