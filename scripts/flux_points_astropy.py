#!/usr/bin/python3
"""Flux-point tables through Debian's python3-astropy (astropy.table), for
skyspan's flux-point reader and writer tests (test/physics/fluxPoints.test.ts).

  write DIR   writes, with astropy, flux-point tables in the open gamma-ray
              data-format layout (columns e_ref/e_min/e_max, dnde or e2dnde,
              errors, upper limits, is_ul; SED_TYPE and UL_CONF in the meta):
              a_dnde.ecsv, a_dnde.fits (dnde in TeV-1 cm-2 s-1 sr-1, e_* in TeV,
              asymmetric errors, one upper limit, UL_CONF 0.9) and
              a_e2dnde.ecsv, a_e2dnde.fits (e2dnde in erg cm-2 s-1 sr-1, e_ref
              in GeV, symmetric errors, an upper limit marked only by a missing
              value, no UL_CONF). Prints JSON: for each file, what astropy
              makes of it in GeV and GeV-1 cm-2 s-1 sr-1 per row (value,
              errLow, errHigh, upperLimit) and the UL confidence.
  read FILE.. reads each file with astropy.table.Table.read and prints JSON:
              per file the columns (unit as astropy understands it, values as
              read, null for NaN), the meta, and e_ref in GeV and the value
              columns in GeV-1 cm-2 s-1 sr-1 converted by astropy.units.
All values are made up.
"""
import json
import os
import sys
import warnings

import numpy as np
import astropy.units as u
from astropy.table import Table

DNDE = u.Unit("GeV-1 cm-2 s-1 sr-1")


def lst(a):
    a = np.asarray(a, dtype=np.float64).ravel()
    return [None if not np.isfinite(v) else float(v) for v in a]


def expected(t):
    sed = t.meta["SED_TYPE"]
    e = t["e_ref"].quantity.to_value(u.GeV) if "e_ref" in t.colnames else np.sqrt(t["e_min"].quantity * t["e_max"].quantity).to_value(u.GeV)
    def internal(name):
        q = t[name].quantity
        if sed == "e2dnde":
            q = q / (e * u.GeV) ** 2
        return q.to_value(DNDE)
    v = internal(sed)
    ul = np.asarray(t["is_ul"], dtype=bool) if "is_ul" in t.colnames else (~np.isfinite(v) & np.isfinite(internal(sed + "_ul")))
    lo = internal(sed + "_errn") if sed + "_errn" in t.colnames else internal(sed + "_err")
    hi = internal(sed + "_errp") if sed + "_errp" in t.colnames else internal(sed + "_err")
    lim = internal(sed + "_ul")
    return {
        "energyGeV": lst(e),
        "value": lst(np.where(ul, lim, v)),
        "errLow": lst(np.where(ul, 0, lo)),
        "errHigh": lst(np.where(ul, 0, hi)),
        "upperLimit": [int(x) for x in ul],
        "ulConfidence": t.meta.get("UL_CONF"),
    }


def write(out):
    res = {}
    a = Table()
    a["e_ref"] = [1.0, 3.0, 10.0, 30.0] * u.TeV
    a["e_min"] = [0.6, 2.0, 6.0, 20.0] * u.TeV
    a["e_max"] = [2.0, 6.0, 20.0, 60.0] * u.TeV
    unit = u.Unit("TeV-1 cm-2 s-1 sr-1")
    a["dnde"] = [2.5e-9, 1.7e-10, 6.1e-12, np.nan] * unit
    a["dnde_errn"] = [0.3e-9, 0.25e-10, 1.4e-12, np.nan] * unit
    a["dnde_errp"] = [0.35e-9, 0.3e-10, 1.9e-12, np.nan] * unit
    a["dnde_ul"] = [np.nan, np.nan, np.nan, 4.4e-13] * unit
    a["is_ul"] = [False, False, False, True]
    a.meta["SED_TYPE"] = "dnde"
    a.meta["UL_CONF"] = 0.9
    b = Table()
    b["e_ref"] = [500.0, 2000.0, 8000.0] * u.GeV
    eunit = u.Unit("erg cm-2 s-1 sr-1")
    b["e2dnde"] = [3.1e-10, 1.2e-10, np.nan] * eunit
    b["e2dnde_err"] = [0.4e-10, 0.3e-10, np.nan] * eunit
    b["e2dnde_ul"] = [np.nan, np.nan, 9e-11] * eunit
    b.meta["SED_TYPE"] = "e2dnde"
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        for name, t in (("a_dnde", a), ("a_e2dnde", b)):
            for ext in ("ecsv", "fits"):
                path = os.path.join(out, f"{name}.{ext}")
                t.write(path, overwrite=True)
                res[f"{name}.{ext}"] = expected(t)
    print(json.dumps(res))


def read(paths):
    res = {}
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        for p in paths:
            t = Table.read(p)
            cols = {}
            for c in t.colnames:
                col = t[c]
                cols[c] = {
                    "unit": None if col.unit is None else col.unit.to_string("fits"),
                    "dtype": str(col.dtype),
                    "values": lst(col) if col.dtype.kind == "f" else [bool(x) if col.dtype.kind == "b" else x.item() for x in col],
                }
            sed = t.meta["SED_TYPE"]
            conv = {"e_ref_GeV": lst(t["e_ref"].quantity.to_value(u.GeV))}
            if sed == "dnde":
                for c in ("dnde", "dnde_errn", "dnde_errp", "dnde_ul"):
                    conv[c] = lst(t[c].quantity.to_value(DNDE))
            res[os.path.basename(p)] = {"columns": cols, "meta": {k: v for k, v in t.meta.items()}, "converted": conv}
    print(json.dumps(res))


if __name__ == "__main__":
    if sys.argv[1] == "write":
        write(sys.argv[2])
    else:
        read(sys.argv[2:])
