/**
 * Minimal type declaration for the part of d3-geo-projection that skyspan uses
 * (the package ships no types). The projections are d3-geo projections.
 */
declare module 'd3-geo-projection' {
  /** Mollweide's equal-area projection (Snyder 1987, USGS PP 1395, p. 249). */
  export function geoMollweide(): import('d3-geo').GeoProjection;
}
