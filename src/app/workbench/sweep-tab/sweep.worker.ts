import { evaluateSweep } from './sweep-evaluation';
import type { SweepJob, SweepMessage } from './sweep-messages';

/** Progress goes out at most this often, so that messages never cost more than the work. */
const PROGRESS_INTERVAL_MS = 50;

addEventListener('message', ({ data }: MessageEvent<SweepJob>) => {
  const post = (message: SweepMessage) => postMessage(message);
  let last = 0;
  try {
    const result = evaluateSweep(data.design, data.request, (done, total) => {
      const now = performance.now();
      if (now - last < PROGRESS_INTERVAL_MS && done < total) return;
      last = now;
      post({ kind: 'progress', done, total });
    });
    post(result.ok ? { kind: 'done', rows: result.rows } : { kind: 'failed', message: result.message });
  } catch (error) {
    post({ kind: 'failed', message: error instanceof Error ? error.message : 'The sweep stopped on an error' });
  }
});
