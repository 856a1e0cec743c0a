#!/usr/bin/env python3
"""Writes the scipy reference fixtures that the engine's filter and spectral tests compare with.

Run from anywhere: python3 tools/reference/generate_scipy.py
Output: test/fixtures/scipy/*.json (paths relative to the repository, found from this file).
Each fixture records the scipy and numpy versions and this script's path.
"""
import json
import pathlib

import numpy as np
import scipy
from scipy import signal

REPOSITORY = pathlib.Path(__file__).resolve().parents[2]
OUTPUT = REPOSITORY / 'test' / 'fixtures' / 'scipy'
SCRIPT = 'tools/reference/generate_scipy.py'


def header(description):
    return {
        'description': description,
        'generator': SCRIPT,
        'scipy': scipy.__version__,
        'numpy': np.__version__,
    }


def write(name, content):
    OUTPUT.mkdir(parents=True, exist_ok=True)
    with open(OUTPUT / name, 'w') as handle:
        json.dump(content, handle, indent=1)
        handle.write('\n')


def design(band, response, order, corner, sample_rate):
    btype = 'lowpass' if band == 'lowPass' else 'highpass'
    if response == 'butterworth':
        return signal.butter(order, corner, btype=btype, output='sos', fs=sample_rate)
    return signal.bessel(order, corner, btype=btype, output='sos', fs=sample_rate, norm='mag')


def deterministic_input(length):
    """A sine, a step and a fixed pseudo-random part from an integer recurrence."""
    n = np.arange(length)
    ramp = ((n * 7919) % 1000) / 1000.0 - 0.5
    return np.sin(0.05 * n) + 0.5 * ramp + (n >= length // 3) * 0.75


def sos_fixture():
    # (corner, sample rate) [Hz]: the baseband low-pass, a carrier-rate high-pass, audio-like rates,
    # a corner near Nyquist and one at 1e-4 of the sample rate.
    settings = [(500.0, 4000.0), (5000.0, 3.2e6), (1000.0, 48000.0), (19000.0, 48000.0), (320.0, 3.2e6)]
    cases = []
    for band in ('lowPass', 'highPass'):
        for response in ('butterworth', 'bessel'):
            for order in (1, 2, 3, 4):
                for corner, sample_rate in settings:
                    sos = design(band, response, order, corner, sample_rate)
                    cases.append({'band': band, 'response': response, 'order': order, 'corner': corner,
                                  'sampleRate': sample_rate, 'sos': sos.tolist()})
    content = header("scipy.signal.butter / scipy.signal.bessel(norm='mag'), output='sos', fs given "
                     '(bilinear transform with pre-warping at the corner)')
    content['cases'] = cases
    write('sos.json', content)


def sosfilt_fixture():
    length = 1000
    x = deterministic_input(length)
    cases = []
    for band, response, order, corner, sample_rate in (
            ('lowPass', 'butterworth', 4, 1000.0, 48000.0),
            ('highPass', 'bessel', 3, 2000.0, 48000.0),
            ('lowPass', 'bessel', 2, 500.0, 4000.0)):
        sos = design(band, response, order, corner, sample_rate)
        y = signal.sosfilt(sos, x)
        cases.append({'band': band, 'response': response, 'order': order, 'corner': corner,
                      'sampleRate': sample_rate, 'sos': sos.tolist(), 'output': y.tolist()})
    content = header('scipy.signal.sosfilt from zero initial state of a deterministic input '
                     '(sin(0.05 n) + 0.5 (((7919 n) mod 1000) / 1000 - 0.5) + 0.75 step at n = length/3)')
    content['input'] = x.tolist()
    content['cases'] = cases
    write('sosfilt.json', content)


def welch_fixture():
    sample_rate = 1000.0
    segment = 256
    x = np.random.default_rng(20240601).normal(0.0, 0.3, 4096) + 0.2 + deterministic_input(4096) * 0.1
    f, pxx = signal.welch(x, sample_rate, window='hann', nperseg=segment, noverlap=segment // 2,
                          scaling='density')
    content = header("scipy.signal.welch(x, fs, window='hann', nperseg, noverlap=nperseg/2, "
                     "scaling='density'), detrend 'constant', one-sided, mean of segments")
    content.update({'sampleRate': sample_rate, 'segmentLength': segment, 'input': x.tolist(),
                    'frequencies': f.tolist(), 'psd': pxx.tolist()})
    write('welch.json', content)


def tone_fixture():
    sample_rate = 8192.0
    segment = 1024
    n = np.arange(8192)
    # One tone centred on bin 64 (512 Hz) and one between bins (1234.5 Hz), on an offset.
    x = 0.75 * np.sin(2 * np.pi * 512.0 * n / sample_rate + 0.3) \
        + 0.2 * np.cos(2 * np.pi * 1234.5 * n / sample_rate) + 0.1
    f, pxx = signal.welch(x, sample_rate, window='hann', nperseg=segment, noverlap=segment // 2,
                          scaling='spectrum')
    content = header("scipy.signal.welch(..., scaling='spectrum') of two tones: power spectrum in V^2 "
                     '(RMS squared per bin); amplitude = sqrt(2 * power) away from DC and Nyquist')
    content.update({'sampleRate': sample_rate, 'segmentLength': segment, 'input': x.tolist(),
                    'tones': [{'frequency': 512.0, 'amplitude': 0.75}, {'frequency': 1234.5, 'amplitude': 0.2}],
                    'frequencies': f.tolist(), 'power': pxx.tolist()})
    write('tone.json', content)


if __name__ == '__main__':
    sos_fixture()
    sosfilt_fixture()
    welch_fixture()
    tone_fixture()
    print(f'wrote fixtures to {OUTPUT.relative_to(REPOSITORY)} with scipy {scipy.__version__}, numpy {np.__version__}')
