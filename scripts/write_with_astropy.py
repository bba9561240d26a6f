#!/usr/bin/python3
"""Reference FITS writer for skyspan's generic reader tests.

Writes, with Debian's python3-astropy (astropy.io.fits), into the folder given
as the first argument:
  image_<bitpix>.fits  primary images of every BITPIX, some scaled (BSCALE,
                       BZERO) and blanked (BLANK);
  table.fits           a BINTABLE with columns of types L B I J K E D,
                       a vector column (3E), TSCALn/TZEROn, TNULLn and TUNITn,
                       a long CONTINUE string and a HIERARCH card;
  ascii.fits           an ASCII TABLE extension (not a map);
  cube_vector.fits     an energy cube with one 4-value vector per pixel and an
                       ENERGIES table in MeV (the layout skyspan reads but
                       does not write).
Prints JSON with the physical values astropy reads back (null for NaN).
All values are made up.
"""
import json
import os
import sys
import warnings

import numpy as np
from astropy.io import fits

out = sys.argv[1]
result = {}


def lst(a):
    a = np.asarray(a, dtype=np.float64).ravel()
    return [None if not np.isfinite(v) else float(v) for v in a]


with warnings.catch_warnings():
    warnings.simplefilter("ignore")
    for bitpix, dtype in [(8, np.uint8), (16, np.int16), (32, np.int32), (64, np.int64), (-32, np.float32), (-64, np.float64)]:
        data = (np.arange(12, dtype=np.float64).reshape(3, 4) * 7 - 20)
        if bitpix == 8:
            data = np.abs(data)
        data = data.astype(dtype)
        hdu = fits.PrimaryHDU(data)
        if bitpix in (16, 32):
            hdu.header["BSCALE"] = 0.5
            hdu.header["BZERO"] = 10.0
            hdu.header["BLANK"] = int(data.ravel()[5])
        path = os.path.join(out, "image_%d.fits" % bitpix)
        hdu.writeto(path, overwrite=True)
        with fits.open(path) as f:
            result["image_%d" % bitpix] = {"dims": list(f[0].data.shape[::-1]), "values": lst(f[0].data)}

    n = 5
    cols = [
        fits.Column(name="FLAG", format="L", array=np.array([True, False, True, True, False])),
        fits.Column(name="BYTE", format="B", array=np.arange(n, dtype=np.uint8) * 50),
        fits.Column(name="SHORT", format="I", array=np.arange(n, dtype=np.int16) - 2, unit="count"),
        fits.Column(name="INT", format="J", array=np.array([1, -7, 99999, -99, 0], dtype=np.int32), null=-99),
        fits.Column(name="LONG", format="K", array=np.array([2**40, -3, 5, 7, 2**52], dtype=np.int64)),
        fits.Column(name="FLT", format="E", array=np.linspace(-1, 1, n).astype(np.float32), unit="GeV"),
        fits.Column(name="DBL", format="D", array=np.linspace(1e-300, 1e300, n)),
        fits.Column(name="VEC", format="3E", array=np.arange(3 * n, dtype=np.float32).reshape(n, 3)),
        fits.Column(name="SCALED", format="I", array=np.arange(n, dtype=np.int16)),
        fits.Column(name="NAME", format="8A", array=np.array(["a", "bb", "c'c", "", "eeeeeeee"])),
    ]
    t = fits.BinTableHDU.from_columns(cols)
    t.header["LONGSTR"] = "x" * 100 + " end"
    t.header["HIERARCH SOME LONG KEY"] = 42
    t.header["DEXP"] = 1.5
    path = os.path.join(out, "table.fits")
    fits.HDUList([fits.PrimaryHDU(), t]).writeto(path, overwrite=True)
    # Scale column 9 after the fact: its stored integers 0..4 read as 100 + 0.25 * k.
    fits.setval(path, "TSCAL9", value=0.25, ext=1)
    fits.setval(path, "TZERO9", value=100.0, ext=1)
    # Force a D exponent in a card (astropy writes E).
    raw = bytearray(open(path, "rb").read())
    i = raw.find(b"DEXP    = ")
    raw[i:i + 80] = ("DEXP    = " + "1.5D0".rjust(20) + " / written with a D exponent").ljust(80).encode()
    open(path, "wb").write(bytes(raw))
    with fits.open(path) as f:
        d = f[1].data
        result["table"] = {c.name: (lst(d[c.name]) if c.name != "NAME" else [str(s) for s in d[c.name]]) for c in f[1].columns}
        result["table"]["LONGSTR"] = f[1].header["LONGSTR"]
        result["table"]["DEXP"] = f[1].header["DEXP"]

    a = fits.TableHDU.from_columns([fits.Column(name="X", format="F8.3", array=np.array([1.5, 2.5]))])
    fits.HDUList([fits.PrimaryHDU(), a]).writeto(os.path.join(out, "ascii.fits"), overwrite=True)

    nside, k = 2, 4
    npix = 12 * nside * nside
    cube = (np.arange(npix * k, dtype=np.float64).reshape(npix, k) * 0.5).astype(np.float32)
    m = fits.BinTableHDU.from_columns([fits.Column(name="SPECTRA", format="%dE" % k, array=cube, unit="MeV-1 cm-2 s-1 sr-1")])
    m.header["PIXTYPE"] = "HEALPIX"
    m.header["ORDERING"] = "RING"
    m.header["NSIDE"] = nside
    m.header["COORDSYS"] = "G"
    m.header["INDXSCHM"] = "IMPLICIT"
    e = fits.BinTableHDU.from_columns([fits.Column(name="Energy", format="D", array=np.array([100.0, 1000.0, 1e4, 1e5]), unit="MeV")])
    e.header["EXTNAME"] = "ENERGIES"
    fits.HDUList([fits.PrimaryHDU(), m, e]).writeto(os.path.join(out, "cube_vector.fits"), overwrite=True)
    result["cube_vector"] = {"planes": [lst(cube[:, j]) for j in range(k)], "energiesGeV": [0.1, 1.0, 10.0, 100.0]}

print(json.dumps(result))
