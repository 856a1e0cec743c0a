import { welchPsd } from '../../../shared/engine/spectral/welch';
import { parseArguments } from '../arguments';
import type { Command } from '../command';
import { EXIT_FINDINGS, EXIT_OK, EXIT_USAGE } from '../command';
import { textTable } from '../table';

/** The numbers of a one-column CSV (the first cell of each row); a header line is skipped. */
function readColumn(text: string): Float64Array | string {
  const values: number[] = [];
  const lines = text.split(/\r?\n/);
  for (let i = 0; i < lines.length; i++) {
    const cell = lines[i].split(/[,;\t]/)[0].trim();
    if (cell === '') continue;
    const value = Number(cell);
    if (!Number.isFinite(value)) {
      if (values.length === 0) continue;
      return `line ${i + 1} is not a number: "${lines[i].trim()}"`;
    }
    values.push(value);
  }
  return Float64Array.from(values);
}

export const psdCommand: Command = {
  name: 'psd',
  usage: 'psd --csv FILE --fs HZ --segment N [--json]',
  summary: "Welch PSD of a one-column CSV (Hann, 50 % overlap, segment 2^k): one-sided V^2/Hz and V/rtHz",
  run(args, io) {
    const { options } = parseArguments(args, ['json']);
    const usage = (message: string) => {
      io.err(message);
      io.err(`usage: ${this.usage}`);
      return EXIT_USAGE;
    };
    const file = options.get('csv');
    const sampleRate = Number(options.get('fs'));
    const segment = Number(options.get('segment'));
    if (typeof file !== 'string') return usage('--csv needs a file');
    if (!(sampleRate > 0) || !Number.isFinite(sampleRate)) return usage('--fs needs a sample rate in Hz above 0');
    if (!Number.isInteger(segment) || segment < 2 || (segment & (segment - 1)) !== 0) return usage('--segment needs a power of two of at least 2');
    let text: string;
    try {
      text = io.readFile(file);
    } catch {
      io.err(`Cannot read ${file}`);
      return EXIT_FINDINGS;
    }
    const column = readColumn(text);
    if (typeof column === 'string') {
      io.err(`${file}: ${column}`);
      return EXIT_FINDINGS;
    }
    if (column.length < segment) return usage(`${file} holds ${column.length} samples, fewer than one segment of ${segment}`);
    const { frequencies, psd } = welchPsd(column, sampleRate, segment);
    if (options.has('json')) {
      io.out(JSON.stringify({ frequencies: Array.from(frequencies), psd: Array.from(psd) }));
      return EXIT_OK;
    }
    const plain = (v: number) => v.toPrecision(4);
    io.out(textTable(['frequency [Hz]', 'PSD [V^2/Hz]', 'density [V/rtHz]'], Array.from(frequencies, (f, k) => [plain(f), plain(psd[k]), plain(Math.sqrt(psd[k]))])));
    return EXIT_OK;
  },
};
