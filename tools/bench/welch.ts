/**
 * Benchmark: Welch PSD of 2^22 samples (Hann, 50 % overlap, density scaling) in Node against
 * scipy.signal.welch on the same data and segment length, both run from here (python3 spawned
 * for the peer, the samples handed over as raw float64). Target: ours at most 1.5x scipy's time.
 * Run: node --import tsx tools/bench/welch.ts [segmentLength]
 */
import { spawnSync } from 'node:child_process';
import { welchPsd } from '../../shared/engine/spectral/welch';
import { GaussianSource } from '../../shared/engine/noise/gaussian';
import { Xoshiro128StarStar } from '../../shared/engine/noise/xoshiro128';

const SAMPLES = 1 << 22;
const SAMPLE_RATE = 3.2e6;
const segmentLength = Number(process.argv[2] ?? 4096);
const REPEATS = 7;

const x = new Float64Array(SAMPLES);
new GaussianSource(new Xoshiro128StarStar(1)).fill(x);

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)];
}

welchPsd(x, SAMPLE_RATE, segmentLength);
const ours: number[] = [];
let psd: Float64Array = new Float64Array(0);
for (let i = 0; i < REPEATS; i++) {
  const start = performance.now();
  psd = welchPsd(x, SAMPLE_RATE, segmentLength).psd;
  ours.push(performance.now() - start);
}

const peer = `
import sys, time, numpy as np
from scipy import signal
x = np.frombuffer(sys.stdin.buffer.read(), dtype=np.float64)
fs, n, repeats = ${SAMPLE_RATE}, ${segmentLength}, ${REPEATS}
signal.welch(x, fs, window='hann', nperseg=n, noverlap=n // 2, scaling='density')
times = []
for _ in range(repeats):
    t = time.perf_counter()
    f, p = signal.welch(x, fs, window='hann', nperseg=n, noverlap=n // 2, scaling='density')
    times.append((time.perf_counter() - t) * 1e3)
print(sorted(times)[len(times) // 2], float(np.max(p)), float(p[len(p) // 3]))
`;
const result = spawnSync('python3', ['-c', peer], { input: Buffer.from(x.buffer), maxBuffer: 1 << 20 });
if (result.status !== 0) {
  console.error(`python3 peer failed: ${result.stderr.toString()}`);
  process.exit(1);
}
const [scipyMs, scipyPeak, scipyThird] = result.stdout.toString().trim().split(/\s+/).map(Number);
const ourMs = median(ours);
const agreement = Math.abs(psd[Math.floor(psd.length / 3)] - scipyThird) / scipyThird;
console.log(`Welch PSD of ${SAMPLES} samples, segment ${segmentLength}, median of ${REPEATS}`);
console.log(`  engine (Node ${process.version}): ${ourMs.toFixed(1)} ms`);
console.log(`  scipy.signal.welch:              ${scipyMs.toFixed(1)} ms`);
console.log(`  ratio engine / scipy: ${(ourMs / scipyMs).toFixed(2)} (target <= 1.5)`);
console.log(`  same result: relative difference ${agreement.toExponential(1)} at bin ${Math.floor(psd.length / 3)}, peak ${scipyPeak.toExponential(3)}`);
