#!/usr/bin/python3
"""Reference writer for skyspan's FITS interop test.

Writes HEALPix maps with Debian's python3-healpy (healpy.write_map) into the
folder given as the first argument, covering RING and NESTED, float32 and
float64, several columns, partial-sky (partial=True), gzip, with and without
COORDSYS, and healpy's single-value rows (fits_IDL=False). Prints a JSON list
describing each file: name, nside, ordering, coordsys, column names and the
values written (full-sky, in the file's ordering; blank pixels as UNSEEN).
Values are made up from simple functions of the pixel index.
"""
import json
import os
import sys
import warnings

import healpy as hp
import numpy as np

out = sys.argv[1]
cases = []


def field(nside, k, dtype):
    i = np.arange(hp.nside2npix(nside), dtype=np.float64)
    return (np.sin(0.37 * i + k) * 10.0 ** (k - 1) + 0.25 * k).astype(dtype)


def add(name, maps, nest=False, coord=None, partial=False, dtype=np.float32, names=None, units=None, fits_idl=True):
    path = os.path.join(out, name)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        hp.write_map(path, maps, nest=nest, coord=coord, partial=partial, dtype=[dtype] * len(maps),
                     column_names=names, column_units=units, fits_IDL=fits_idl, overwrite=True)
    cases.append({
        "file": name,
        "nside": int(hp.get_nside(maps[0])),
        "ordering": "NESTED" if nest else "RING",
        "coordsys": coord,
        "columns": names,
        "values": [[float(v) for v in np.asarray(m, dtype=dtype).astype(np.float64)] for m in maps],
    })


add("ring32.fits", [field(16, 0, np.float32)], coord="G", names=["INTENSITY"], units=["cm^-2 s^-1 sr^-1"])
add("nest64.fits", [field(8, 1, np.float64)], nest=True, coord="C", dtype=np.float64, names=["FLUX"])
add("three.fits", [field(4, k, np.float32) for k in range(3)], coord="G", names=["A", "B", "C"], units=["u1", "u2", "u3"])
part = field(16, 2, np.float64)
part[hp.nside2npix(16) // 3:] = hp.UNSEEN
add("partial.fits", [part], coord="G", partial=True, dtype=np.float64, names=["SIGNAL"])
partn = field(8, 3, np.float32)
partn[::2] = hp.UNSEEN
add("partial_nest.fits.gz", [partn], nest=True, coord="C", partial=True, names=["SIGNAL"])
add("zipped.fits.gz", [field(32, 1, np.float32), field(32, 2, np.float32)], coord="G", names=["I", "Q"])
add("nocoord.fits", [field(2, 0, np.float64)], dtype=np.float64, names=["T"])
add("rows.fits", [field(16, 4, np.float32)], coord="G", names=["T"], fits_idl=False)
print(json.dumps(cases))
