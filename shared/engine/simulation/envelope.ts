/**
 * Min/max envelope decimation for display: each pixel column holds the smallest and largest of
 * its run of samples, so a plot of a million samples in a thousand columns still shows every peak.
 */

export interface Envelope {
  /** Per column: the extremes of its samples [the waveform's unit]. */
  min: Float32Array;
  max: Float32Array;
  /** Samples behind each column (the last one may hold fewer). */
  samplesPerColumn: number;
}

/** Builds an envelope block by block while the waveform is produced, without keeping it. */
export class EnvelopeRecorder {
  readonly samplesPerColumn: number;
  private readonly min: Float32Array;
  private readonly max: Float32Array;
  private column = 0;
  private filled = 0;
  private low = Infinity;
  private high = -Infinity;

  /** @param totalSamples length of the whole waveform; columns at most that many. */
  constructor(totalSamples: number, columns: number) {
    const count = Math.max(1, Math.min(columns, totalSamples));
    this.samplesPerColumn = Math.max(1, Math.ceil(totalSamples / count));
    const used = Math.max(1, Math.ceil(totalSamples / this.samplesPerColumn));
    this.min = new Float32Array(used);
    this.max = new Float32Array(used);
  }

  add(block: Float64Array, length = block.length): void {
    const per = this.samplesPerColumn;
    let { column, filled, low, high } = this;
    const columns = this.min.length;
    for (let n = 0; n < length && column < columns; ) {
      const end = Math.min(length, n + per - filled);
      for (let m = n; m < end; m++) {
        const v = block[m];
        if (v < low) low = v;
        if (v > high) high = v;
      }
      filled += end - n;
      n = end;
      if (filled === per) {
        this.min[column] = low;
        this.max[column] = high;
        column++;
        filled = 0;
        low = Infinity;
        high = -Infinity;
      }
    }
    this.column = column;
    this.filled = filled;
    this.low = low;
    this.high = high;
  }

  /** The envelope so far; a partly filled last column counts with the samples it has. */
  result(): Envelope {
    const columns = this.filled > 0 ? this.column + 1 : this.column;
    const min = this.min.slice(0, columns);
    const max = this.max.slice(0, columns);
    if (this.filled > 0) {
      min[this.column] = this.low;
      max[this.column] = this.high;
    }
    return { min, max, samplesPerColumn: this.samplesPerColumn };
  }
}

/** Envelope of a whole waveform in (at most) `columns` columns. */
export function minMaxEnvelope(waveform: Float64Array, columns: number): Envelope {
  const recorder = new EnvelopeRecorder(waveform.length, columns);
  recorder.add(waveform);
  return recorder.result();
}
