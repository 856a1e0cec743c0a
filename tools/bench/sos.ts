/**
 * Benchmark: throughput of the engine's SOS filter (4th-order Butterworth low-pass, two sections)
 * on 2^22 samples against scipy.signal.sosfilt on the same data and coefficients (python3 spawned),
 * plus the noise generators' rates for reference.
 * Run: node --import tsx tools/bench/sos.ts
 */
import { spawnSync } from 'node:child_process';
import { lowPassSos } from '../../shared/engine/filters/digital';
import { SosFilter } from '../../shared/engine/filters/sos-filter';
import { FlickerNoise } from '../../shared/engine/noise/flicker-noise';
import { GaussianSource } from '../../shared/engine/noise/gaussian';
import { Xoshiro128StarStar } from '../../shared/engine/noise/xoshiro128';

const SAMPLES = 1 << 22;
const SAMPLE_RATE = 3.2e6;
const REPEATS = 7;

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)];
}

function time(run: () => void): number {
  run();
  const times: number[] = [];
  for (let i = 0; i < REPEATS; i++) {
    const start = performance.now();
    run();
    times.push(performance.now() - start);
  }
  return median(times);
}

const x = new Float64Array(SAMPLES);
new GaussianSource(new Xoshiro128StarStar(1)).fill(x);
const sos = lowPassSos('butterworth', 4, 5e3, SAMPLE_RATE);
const output = new Float64Array(SAMPLES);
const filter = new SosFilter(sos);
const sosMs = time(() => filter.process(x, output));

const peer = `
import sys, time, json, numpy as np
from scipy import signal
x = np.frombuffer(sys.stdin.buffer.read(), dtype=np.float64)
sos = np.array(json.loads(sys.argv[1])).reshape(-1, 6)
signal.sosfilt(sos, x)
times = []
for _ in range(${REPEATS}):
    t = time.perf_counter()
    signal.sosfilt(sos, x)
    times.append((time.perf_counter() - t) * 1e3)
print(sorted(times)[len(times) // 2])
`;
const result = spawnSync('python3', ['-c', peer, JSON.stringify(Array.from(sos))], { input: Buffer.from(x.buffer) });
if (result.status !== 0) {
  console.error(`python3 peer failed: ${result.stderr.toString()}`);
  process.exit(1);
}
const scipyMs = Number(result.stdout.toString().trim());

const gaussian = new GaussianSource(new Xoshiro128StarStar(2));
const gaussianMs = time(() => gaussian.fill(output));
const flicker = new FlickerNoise({ density: 8e-9, corner: 2e3, sampleRate: SAMPLE_RATE, lowestFrequency: 50 }, new Xoshiro128StarStar(3));
const flickerMs = time(() => flicker.fill(output));

const rate = (ms: number): string => `${(SAMPLES / (ms / 1e3) / 1e6).toFixed(1)} MS/s`;
console.log(`${SAMPLES} samples, median of ${REPEATS}`);
console.log(`  SOS 4th-order low-pass, engine (Node ${process.version}): ${sosMs.toFixed(1)} ms, ${rate(sosMs)}`);
console.log(`  scipy.signal.sosfilt:                        ${scipyMs.toFixed(1)} ms, ${rate(scipyMs)}`);
console.log(`  ratio engine / scipy time: ${(sosMs / scipyMs).toFixed(2)}`);
console.log(`  Gaussian (Marsaglia polar, xoshiro128**): ${rate(gaussianMs)}`);
console.log(`  flicker noise (${flicker.poleCount} poles, f0/1000 = 50 Hz at 3.2 MS/s): ${rate(flickerMs)}`);
