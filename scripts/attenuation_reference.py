#!/usr/bin/python3
"""Independent reference for skyspan's pair-production attenuation lengths.

Integrates the Breit-Wheeler cross-section (Breit & Wheeler 1934, Phys. Rev. 46,
1087; form as in Gould & Schreder 1967, Phys. Rev. 155, 1404) directly over
photon energy and angle of an isotropic Planck field, with scipy's adaptive
quadrature and scipy.constants (CODATA), so it shares no code or formulation
with src/physics/absorption (which tabulates the angle-integrated function in
the invariant s):

  1/lambda(E) = int d(eps) n(eps) int_{-1}^{1} d(mu) (1 - mu)/2 sigma(s),
  s = E eps (1 - mu) / (2 m_e^2 c^4),  n = Planck photon density at T, times dilution W.

Usage: attenuation_reference.py [T_K [W]] < energies_GeV (JSON list)
Prints JSON: {"lambda_kpc": [...], "sigma_max": {"s": .., "ratio": ..},
              "minimum": {"E_GeV": .., "lambda_kpc": ..}}.
"""
import json
import sys

import numpy as np
from scipy import constants as C
from scipy.integrate import quad
from scipy.optimize import minimize_scalar

ME = C.physical_constants['electron mass energy equivalent in MeV'][0] * 1e-3  # GeV
SIGMA_T = C.physical_constants['Thomson cross section'][0] * 1e4  # cm^2
KB = C.physical_constants['Boltzmann constant in eV/K'][0] * 1e-9  # GeV/K
HBARC = C.hbar * C.c / C.e * 1e-9 * 1e2  # GeV cm
KPC = 1e3 * C.parsec * 1e2  # cm


def sigma_ratio(s):
    """Breit-Wheeler cross-section over sigma_T."""
    if s <= 1.0:
        return 0.0
    b = np.sqrt(1.0 - 1.0 / s)
    return 3.0 / 16.0 * (1 - b * b) * ((3 - b ** 4) * np.log((1 + b) / (1 - b)) - 2 * b * (2 - b * b))


def angle_average(E, eps):
    """int d(mu) (1 - mu)/2 sigma over mu in [-1, mu_max]."""
    s0 = E * eps / ME ** 2
    if s0 <= 1.0:
        return 0.0
    mu_max = 1.0 - 2.0 / s0
    f = lambda mu: 0.5 * (1 - mu) * sigma_ratio(s0 * (1 - mu) / 2)
    return SIGMA_T * quad(f, -1.0, mu_max, epsabs=0, epsrel=1e-8, limit=200)[0]


def inv_lambda(E, T, W):
    kT = KB * T
    pref = W / np.pi ** 2 / HBARC ** 3
    eps_th = ME ** 2 / E
    # outer integral in ln(eps) from threshold to 60 kT
    lo, hi = np.log(eps_th), np.log(max(60 * kT, eps_th * 1.0001))
    if hi <= lo:
        return 0.0
    g = lambda le: (lambda eps: pref * eps ** 3 / np.expm1(eps / kT) * angle_average(E, eps))(np.exp(le))
    return quad(g, lo, hi, epsabs=0, epsrel=1e-8, limit=400)[0]


def lambda_kpc(E, T, W):
    il = inv_lambda(E, T, W)
    return float('inf') if il == 0 else 1.0 / il / KPC


def main():
    T = float(sys.argv[1]) if len(sys.argv) > 1 else 2.7255
    W = float(sys.argv[2]) if len(sys.argv) > 2 else 1.0
    energies = json.loads(sys.stdin.read() or '[]')
    out = {'lambda_kpc': [lambda_kpc(float(e), T, W) for e in energies]}
    r = minimize_scalar(lambda s: -sigma_ratio(s), bounds=(1.0001, 10), method='bounded', options={'xatol': 1e-8})
    out['sigma_max'] = {'s': r.x, 'ratio': -r.fun}
    if T == 2.7255 and W == 1.0:
        m = minimize_scalar(lambda le: lambda_kpc(np.exp(le), T, W), bounds=(np.log(1e6), np.log(5e6)),
                            method='bounded', options={'xatol': 2e-3})
        out['minimum'] = {'E_GeV': float(np.exp(m.x)), 'lambda_kpc': float(m.fun)}
    out['constants'] = {'me_GeV': ME, 'sigmaT_cm2': SIGMA_T, 'kB_GeV_K': KB, 'hbarc_GeV_cm': HBARC, 'kpc_cm': KPC}
    print(json.dumps(out))


if __name__ == '__main__':
    main()
