#!/usr/bin/env python3
"""Fits the top of the flicker-noise shaping cascade used by shared/engine/noise/flicker-noise.ts.

The cascade interlaces one real pole and one real zero per half decade (matched z-transform),
anchored at the Nyquist frequency: zero k at fs/2 * 10^(-k/2), pole k half a step below it. Far
below Nyquist this gives |H|^2 proportional to 1/f with a tiny ripple; near Nyquist the matched
z-transform bends the slope, so the three highest pairs get their frequencies moved by factors
fitted here (minimax of the dB error from 1e-5 fs to fs/2). The script prints the constants that
the TypeScript module holds; it is run by hand when the design changes, not by the tests.
"""
import numpy as np
from scipy.optimize import minimize

STEP = 10 ** 0.5
FITTED_PAIRS = 3
LOWEST = 1e-5  # lowest evaluated frequency, in units of fs
REFERENCE = 0.5e-3  # frequency (units of fs) where the TypeScript module sets the level

frequencies = np.logspace(np.log10(LOWEST), np.log10(0.5), 1200)
z_inverse = np.exp(-2j * np.pi * frequencies)


def pairs(offsets):
    count = int(np.ceil(np.log(0.5 / (LOWEST / 30)) / np.log(STEP)))
    result = []
    for k in range(count):
        zero = 0.5 * STEP ** (-k)
        pole = zero / np.sqrt(STEP)
        if k < FITTED_PAIRS:
            pole *= np.exp(offsets[2 * k])
            zero *= np.exp(offsets[2 * k + 1])
        result.append((pole, zero))
    return result


def error_db(offsets, at=frequencies, z=z_inverse):
    response = np.ones_like(z)
    for pole, zero in pairs(offsets):
        response *= (1 - np.exp(-2 * np.pi * zero) * z) / (1 - np.exp(-2 * np.pi * pole) * z)
    return 10 * np.log10(np.abs(response) ** 2 * at)


def spread(offsets):
    e = error_db(offsets)
    return e.max() - e.min()


best = None
for trial in range(12):
    start = np.random.default_rng(trial).normal(0, 0.3, 2 * FITTED_PAIRS)
    result = minimize(spread, start, method='Nelder-Mead',
                      options={'maxiter': 20000, 'xatol': 1e-7, 'fatol': 1e-9})
    if best is None or result.fun < best.fun:
        best = result

e = error_db(best.x)
centre = (e.max() + e.min()) / 2
reference = error_db(best.x, np.array([REFERENCE]), np.exp(-2j * np.pi * np.array([REFERENCE])))[0]
print('pole/zero frequency factors of the top pairs (pole, zero):')
for k in range(FITTED_PAIRS):
    print(f'  [{np.exp(best.x[2 * k]):.12f}, {np.exp(best.x[2 * k + 1]):.12f}],')
print(f'level at the reference frequency relative to the centre of the error band: {reference - centre:.12f} dB')
print(f'error band: +/-{(e.max() - e.min()) / 2:.4f} dB')
