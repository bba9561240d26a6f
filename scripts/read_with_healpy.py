#!/usr/bin/python3
"""Reference reader for skyspan's FITS interop test.

Reads each HEALPix FITS file named on the command line with Debian's
python3-healpy (healpy.read_map) and python3-astropy (astropy.io.fits), and
prints one JSON object per file: what healpy read (nside, ordering, COORDSYS,
the values of every map column in the file's own ordering) and what astropy
saw (HDU names, column names, formats and units, the ENERGIES table).
Non-finite values are printed as null (JSON has no NaN).
"""
import json
import sys
import warnings

import healpy as hp
import numpy as np
from astropy.io import fits


def finite_list(a):
    a = np.asarray(a, dtype=np.float64)
    return [None if not np.isfinite(v) else float(v) for v in a]


def describe(path):
    with fits.open(path) as hdul:
        hdul.verify("exception")
        table = hdul[1]
        hdr = table.header
        cols = [{"name": c.name, "format": c.format, "unit": c.unit or ""} for c in table.columns]
        hdus = [h.name for h in hdul]
        energies = None
        if "ENERGIES" in hdus:
            e = hdul["ENERGIES"]
            energies = {"values": finite_list(e.data.field(0)), "unit": e.columns[0].unit}
        explicit = str(hdr.get("INDXSCHM", "IMPLICIT")).strip() == "EXPLICIT"
        value_cols = [c["name"] for c in cols if c["name"] != "PIXEL"]
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        fields = tuple(range(len(value_cols)))
        maps, header = hp.read_map(path, field=fields, nest=None, h=True, dtype=None, partial=False)
    header = dict(header)
    maps = np.atleast_2d(maps)
    return {
        "file": path,
        "nside": int(hp.get_nside(maps[0])),
        "ordering": str(header.get("ORDERING")).strip(),
        "coordsys": header.get("COORDSYS"),
        "explicit": explicit,
        "hdus": hdus,
        "columns": cols,
        "energies": energies,
        "values": [finite_list(m) for m in maps],
    }


print(json.dumps([describe(p) for p in sys.argv[1:]]))
