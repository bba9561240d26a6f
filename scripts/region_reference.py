#!/usr/bin/python3
"""Reference pixel set for skyspan's region evaluation in centre mode, made
with healpy alone (pixel centres, healpy.Rotator, healpy.query_disc).

The region: the declination band a site at latitude SITE_LAT sees within
MAX_ZENITH of its zenith (|dec - lat| <= cut), intersected with a Galactic
box (l from L1 to L2, |b| <= B), minus source discs read from a CSV catalogue
(columns name, lon, lat, frame, radius in degrees; empty radius -> DEFAULT_R;
every radius grown as sqrt(r^2 + (PSF_TIMES * PSF)^2)).

Usage: /usr/bin/python3 scripts/region_reference.py CATALOGUE.csv NSIDE:FRAME [NSIDE:FRAME ...]
  FRAME: galactic or equatorial (the frame of the template's pixels)
Prints JSON: a list of {"nside": N, "frame": F, "pixels": [RING indices in the region]}
"""
import csv
import json
import math
import sys

import healpy as hp
import numpy as np

SITE_LAT, MAX_ZENITH = 33.0, 45.0
L1, L2, B = 20.0, 110.0, 4.0
DEFAULT_R, PSF, PSF_TIMES = 1.0, 0.3, 2.0


def region_pixels(nside, frame, catalogue):
    npix = hp.nside2npix(nside)
    vec = np.array(hp.pix2vec(nside, np.arange(npix)))
    if frame == 'galactic':
        vg = vec
        ve = hp.Rotator(coord=['G', 'C'])(vec)
    else:
        ve = vec
        vg = hp.Rotator(coord=['C', 'G'])(vec)
    l_deg, b_deg = hp.vec2dir(vg, lonlat=True)
    _, dec_deg = hp.vec2dir(ve, lonlat=True)
    l_deg = np.mod(l_deg, 360.0)
    inside = (dec_deg >= SITE_LAT - MAX_ZENITH) & (dec_deg <= SITE_LAT + MAX_ZENITH)
    inside &= (l_deg >= L1) & (l_deg <= L2) & (np.abs(b_deg) <= B)
    to_map = {'galactic': hp.Rotator(coord=['G', 'C']) if frame == 'equatorial' else None,
              'equatorial': hp.Rotator(coord=['C', 'G']) if frame == 'galactic' else None}
    with open(catalogue, newline='') as fh:
        rows = [r for r in csv.DictReader(line for line in fh if not line.startswith('#'))]
    for r in rows:
        radius = float(r['radius']) if r['radius'].strip() else DEFAULT_R
        radius = math.sqrt(radius ** 2 + (PSF_TIMES * PSF) ** 2)
        v = hp.dir2vec(float(r['lon']), float(r['lat']), lonlat=True)
        rot = to_map[r['frame'].strip()]
        if rot is not None:
            v = rot(v)
        hole = hp.query_disc(nside, v, math.radians(radius), inclusive=False)
        inside[hole] = False
    return {"nside": nside, "frame": frame, "pixels": np.nonzero(inside)[0].tolist()}


def main():
    catalogue = sys.argv[1]
    out = []
    for spec in sys.argv[2:]:
        nside, frame = spec.split(':')
        out.append(region_pixels(int(nside), frame, catalogue))
    json.dump(out, sys.stdout)


if __name__ == '__main__':
    main()
