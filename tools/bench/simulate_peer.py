"""Peer of tools/bench/simulate.ts: the same chain written the way a designer would in a notebook,
numpy for the charges, demodulator and ADC, scipy.signal.sosfilt for every filter and amplifier
pole, numpy's default generator for the noise. Reads the chain's coefficients (JSON) on stdin and
prints the median time per run in ms for the noise-free and the noisy chain, as JSON."""
import json
import sys
import time

import numpy as np
import scipy
from scipy import signal

plan = json.load(sys.stdin)
samples = plan["samples"]
period = len(plan["drive"])
repeats = plan["repeats"]
drive = np.tile(np.array(plan["drive"]), samples // period + 1)[:samples]
reference = np.tile(np.array(plan["reference"]), samples // period + 1)[:samples]
rng = np.random.default_rng(1)


def flicker(density, poles, sample_rate):
    """White floor plus a 1/f shaping cascade with as many first-order sections as the engine's."""
    white = rng.standard_normal(samples) * density * np.sqrt(sample_rate / 2)
    theta = 2 * np.pi * 0.5 * np.sqrt(10.0) ** -np.arange(poles)
    rows = [[1.0, -np.exp(-t), 0.0, 1.0, -np.exp(-t / np.sqrt(10.0)), 0.0] for t in theta]
    if len(rows) % 2:
        rows.append([1.0, 0.0, 0.0, 1.0, 0.0, 0.0])
    return white + signal.sosfilt(np.array(rows), rng.standard_normal(samples) * density)


def chain(noisy):
    fs = plan["sampleRate"]
    amplitude = plan["amplitude"] + (rng.standard_normal(samples) * plan["amplitudeNoise"] * np.sqrt(fs / 2) if noisy else 0)
    v = drive * amplitude
    outputs = []
    for side in plan["sides"]:
        q = side["residual"] * v
        dq = np.diff(q, prepend=q[0] * -1)
        if noisy:
            e = flicker(side["voltageNoise"], plan["flickerPoles"], fs)
            dq = dq + rng.standard_normal(samples) * side["currentNoise"] - side["totalCapacitance"] * np.diff(e, prepend=0)
        u = signal.sosfilt(np.array([side["charge"]]), dq)
        if noisy:
            u = u + e
        w = signal.sosfilt(np.array([side["pole"]]), u)
        outputs.append(np.clip(plan["centre"] + w, plan["swing"][0], plan["swing"][1]))
    x = outputs[1] - outputs[0]
    if noisy:
        x = x + flicker(plan["gainNoise"], plan["flickerPoles"], fs)
    x = np.clip(signal.sosfilt(np.array([plan["gain"]]), x), -plan["limit"], plan["limit"])
    x = signal.sosfilt(np.array(plan["highPass"]).reshape(-1, 6), x)
    x = x * reference
    if noisy:
        x = x + flicker(plan["lowPassNoise"], plan["flickerPoles"], fs)
    x = np.clip(signal.sosfilt(np.array(plan["lowPass"]).reshape(-1, 6), x), -plan["limit"], plan["limit"])
    adc = plan["adc"]
    codes = np.clip(np.round((x[:: adc["ratio"]] + adc["offset"]) / adc["step"]), 0, adc["topCode"])
    return codes * adc["step"] - adc["offset"]


def median_ms(noisy):
    chain(noisy)
    times = []
    for _ in range(repeats):
        start = time.perf_counter()
        chain(noisy)
        times.append((time.perf_counter() - start) * 1e3)
    return sorted(times)[len(times) // 2]


print(json.dumps({"quiet": median_ms(False), "noisy": median_ms(True), "numpy": np.__version__, "scipy": scipy.__version__}))
