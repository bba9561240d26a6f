/** The generic FITS reader and writer (FITS Standard 4.0, Pence et al. 2010, A&A 524, A42). */
export { parseCard, parseValueField, formatCards, type Card, type CardValue } from './cards.js';
export { FitsHeader, readHeader, BLOCK, CARD } from './header.js';
export { walkHdus, type Hdu, type HduKind } from './hdu.js';
export { tableLayout, readColumn, readTextColumn, findColumn, type TableLayout, type TableColumn } from './bintable.js';
export { parseTform, type ColumnFormat } from './tform.js';
export { readImage, type ImageData } from './image.js';
export { loadFitsBytes, isGzip, gunzipFits } from './source.js';
export { headerBytes, primaryHdu, bintableHdu, type CardSpec, type ColumnSpec } from './writer.js';
export { decodeContiguous, decodeStrided, type DecodedArray, type ElementType } from './decode.js';
