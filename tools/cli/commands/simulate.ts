import { writeFileSync } from 'node:fs';
import { parseInputSpec, parsePiecewiseLinearCsv, type InputProfile, type SimulationOptionsInput } from '../../../shared/contracts/simulation';
import { simulate } from '../../../shared/engine/simulation/simulator';
import { formatQuantity } from '../../../shared/units/format';
import { parseArguments } from '../arguments';
import type { Command } from '../command';
import { EXIT_FINDINGS, EXIT_OK, EXIT_USAGE } from '../command';
import { readDesign } from '../read-design';
import { textTable } from '../table';

const plain = (value: number | null) => (value === null ? '-' : String(Number(value.toPrecision(4))));
const voltage = (value: number | null) => (value === null ? '-' : formatQuantity(value, 'voltage'));
const time = (value: number | null) => (value === null ? '-' : formatQuantity(value, 'time'));

/** A whole number from a flag, or a message. */
function wholeFlag(text: string | true | undefined, name: string): number | undefined | string {
  if (text === undefined) return undefined;
  const value = Number(text);
  return text === true || !Number.isInteger(value) ? `--${name} needs a whole number` : value;
}

export const simulateCommand: Command = {
  name: 'simulate',
  usage: 'simulate <design.json> --duration S [--seed N] [--samples-per-period N] [--input SPEC] [--no-noise] [--node ID --csv FILE] [--json]',
  summary: 'Time-domain simulation of the chain: noise, sensitivity, ripple and step response measured on the waveforms',
  run(args, io) {
    const { positional, options } = parseArguments(args, ['json', 'no-noise']);
    const usage = (message: string) => {
      io.err(message);
      io.err(`usage: ${this.usage}`);
      return EXIT_USAGE;
    };
    if (positional.length !== 1) return usage('one design file is needed');
    const duration = Number(options.get('duration'));
    if (!options.has('duration') || !(duration > 0)) return usage('--duration needs a time in s above 0');
    const seed = wholeFlag(options.get('seed'), 'seed');
    const samplesPerPeriod = wholeFlag(options.get('samples-per-period'), 'samples-per-period');
    if (typeof seed === 'string') return usage(seed);
    if (typeof samplesPerPeriod === 'string') return usage(samplesPerPeriod);
    const node = options.get('node');
    const csv = options.get('csv');
    if ((node === undefined) !== (csv === undefined) || node === true || csv === true) return usage('--node ID and --csv FILE go together');

    let input: InputProfile | undefined;
    const spec = options.get('input');
    if (spec !== undefined) {
      if (spec === true) return usage('--input needs a SPEC');
      let parsed;
      if (spec.startsWith('pwl:@')) {
        const file = spec.slice('pwl:@'.length);
        let text: string;
        try {
          text = io.readFile(file);
        } catch {
          io.err(`Cannot read ${file}`);
          return EXIT_FINDINGS;
        }
        parsed = parsePiecewiseLinearCsv(text);
      } else {
        parsed = parseInputSpec(spec);
      }
      if (!parsed.ok) return usage(parsed.message);
      input = parsed.profile;
    }

    const read = readDesign(positional[0], io);
    if ('message' in read) {
      io.err(read.message);
      return EXIT_FINDINGS;
    }
    if (!read.analysis.ok) {
      for (const error of read.analysis.errors) io.err(`error ${error.path === '' ? '(document)' : error.path}: ${error.message}`);
      return EXIT_FINDINGS;
    }
    const request: SimulationOptionsInput = { duration, noise: !options.has('no-noise'), input, record: node === undefined ? [] : [node] };
    if (seed !== undefined) request.seed = seed;
    if (samplesPerPeriod !== undefined) request.samplesPerPeriod = samplesPerPeriod;

    const started = performance.now();
    let result;
    try {
      result = simulate(read.analysis.design, request);
    } catch (error) {
      return usage((error as Error).message.split('\n')[0]);
    }
    const elapsedMs = performance.now() - started;

    if (node !== undefined && csv !== undefined) {
      const recorded = result.nodes.find((n) => n.id === node);
      if (recorded?.waveform == null) return usage(`No node "${node}"; nodes: ${result.nodes.map((n) => n.id).join(', ')}`);
      const lines = [`${node} [${recorded.unit}] at ${recorded.sampleRate} Hz`];
      for (const v of recorded.waveform) lines.push(String(v));
      writeFileSync(csv, `${lines.join('\n')}\n`);
    }

    const { figures, analytic } = result;
    const summary = {
      sampleRate: result.sampleRate,
      samples: result.samples,
      duration: result.duration,
      seed: result.seed,
      noise: result.noise,
      input: result.input,
      trim: result.trim,
      outputNode: result.output.node,
      outputSampleRate: result.output.sampleRate,
      outputRms: figures.outputRms,
      band: { low: figures.bandLow, high: figures.bandHigh },
      sensitivityVoltsPerFarad: figures.sensitivityVoltsPerFarad,
      ripplePeak: figures.ripplePeak,
      rippleNode: figures.rippleNode,
      step: figures.step,
      settlingTime: figures.settlingTime,
      analytic,
      clippedSamples: Object.fromEntries(result.nodes.filter((n) => n.clippedSamples > 0).map((n) => [n.id, n.clippedSamples])),
      findings: result.findings,
      elapsedMs,
    };
    if (options.has('json')) {
      io.out(JSON.stringify(summary, null, 2));
      return EXIT_OK;
    }
    const ratio = (simulated: number | null, expected: number | null) => (simulated === null || expected === null || expected === 0 ? '-' : plain(simulated / expected));
    const rows = [
      [result.input.kind === 'constant' ? 'output noise' : 'output rms in band (with the signal)', `${voltage(figures.outputRms)} rms`, `${voltage(analytic.outputRms)} rms`, ratio(figures.outputRms, analytic.outputRms)],
      ['sensitivity', figures.sensitivityVoltsPerFarad === null ? '-' : formatQuantity(figures.sensitivityVoltsPerFarad, 'voltsPerFarad'), analytic.sensitivityVoltsPerFarad === null ? '-' : formatQuantity(analytic.sensitivityVoltsPerFarad, 'voltsPerFarad'), ratio(figures.sensitivityVoltsPerFarad, analytic.sensitivityVoltsPerFarad)],
      ['carrier ripple', `${voltage(figures.ripplePeak)} peak`, `${voltage(analytic.ripplePeak)} peak (full scale)`, '-'],
    ];
    if (figures.step !== null) {
      rows.push(
        ['rise 10-90 %', time(figures.step.rise), time(analytic.step.rise), ratio(figures.step.rise, analytic.step.rise)],
        ['overshoot', `${plain(figures.step.overshoot * 100)} %`, `${plain(analytic.step.overshoot === null ? null : analytic.step.overshoot * 100)} %`, '-'],
        ['settling 1 %', time(figures.step.settle1), time(analytic.step.settle1), ratio(figures.step.settle1, analytic.step.settle1)],
        ['settling 0.1 %', time(figures.step.settle01), time(analytic.step.settle01), ratio(figures.step.settle01, analytic.step.settle01)],
      );
    }
    io.out(
      [
        `${result.samples} samples at ${formatQuantity(result.sampleRate, 'frequency')} (${result.samplesPerPeriod} per carrier period), ${result.noise ? `noise on, seed ${result.seed}` : 'noise off'}, in ${Math.round(elapsedMs)} ms`,
        `noise band ${formatQuantity(figures.bandLow, 'frequency')} to ${formatQuantity(figures.bandHigh, 'frequency')} on ${result.output.node}; ripple and step on ${figures.rippleNode}; figures after ${time(figures.settlingTime)} of settling`,
        textTable(['figure', 'simulated', 'analytic', 'ratio'], rows),
        ...result.findings.map((f) => `${f.severity} ${f.path}: ${f.message}`),
      ].join('\n'),
    );
    return EXIT_OK;
  },
};
