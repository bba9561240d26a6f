#!/usr/bin/python3
"""Does Debian's python3-healpy read or refuse each HEALPix FITS file named on the command line?

Prints one JSON object per line: {"file", "refused", "error", "npix"}. skyspan's
limits test uses it as the reference for refusing an NSIDE that disagrees with
the data length (healpy.read_map raises ValueError "Wrong nside parameter.").
"""
import json
import sys
import warnings

import healpy as hp

for path in sys.argv[1:]:
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        try:
            m = hp.read_map(path)
            print(json.dumps({"file": path, "refused": False, "error": None, "npix": int(m.size)}))
        except Exception as e:  # the reference's refusal, whatever its type
            print(json.dumps({"file": path, "refused": True, "error": f"{type(e).__name__}: {e}", "npix": None}))
