import { TestBed } from '@angular/core/testing';
import demoPressure from '@shared/examples/demo-pressure.json';
import { SimulationRunner, type SimulationEvent } from './simulation-runner';

describe('SimulationRunner', () => {
  let runner: SimulationRunner;

  beforeEach(() => {
    TestBed.configureTestingModule({});
    runner = TestBed.inject(SimulationRunner);
  });

  it('should report rising progress, then a result with transferred typed arrays', async () => {
    const events: SimulationEvent[] = [];
    await new Promise<void>((resolve, reject) => {
      runner.run(demoPressure, { duration: 0.01, seed: 2 }).subscribe({ next: (e) => events.push(e), error: reject, complete: resolve });
    });
    const progress = events.filter((e) => e.type === 'progress').map((e) => (e.type === 'progress' ? e.fraction : 0));
    expect(progress.length).toBeGreaterThan(0);
    expect(progress.every((f, i) => i === 0 || f >= progress[i - 1])).toBeTrue();
    expect(progress[progress.length - 1]).toBe(1);
    const last = events[events.length - 1];
    expect(last.type).toBe('result');
    if (last.type !== 'result') return;
    expect(last.result.samples).toBe(32000);
    expect(last.result.output.volts).toBeInstanceOf(Float64Array);
    expect(last.result.output.volts.length).toBe(40);
    expect(last.result.nodes.find((n) => n.id === 'ca.A')?.envelope?.max).toBeInstanceOf(Float32Array);
    expect(last.result.figures.sensitivityVoltsPerFarad).toBeGreaterThan(0);
  });

  it('should stop the worker within 100 ms of cancel and send nothing after it', async () => {
    const events: SimulationEvent[] = [];
    let cancelledAt = 0;
    const completedAt = await new Promise<number>((resolve, reject) => {
      runner.run(demoPressure, { duration: 5 }).subscribe({
        next: (e) => {
          events.push(e);
          if (cancelledAt === 0) {
            cancelledAt = performance.now();
            runner.cancel();
          }
        },
        error: reject,
        complete: () => resolve(performance.now()),
      });
    });
    expect(completedAt - cancelledAt).toBeLessThan(100);
    const seen = events.length;
    await new Promise((resolve) => setTimeout(resolve, 300));
    expect(events.length).toBe(seen);
    expect(events.every((e) => e.type === 'progress')).toBeTrue();
  });

  it('should stop the worker when the subscriber unsubscribes', async () => {
    const events: SimulationEvent[] = [];
    const subscription = runner.run(demoPressure, { duration: 5 }).subscribe((e) => events.push(e));
    await new Promise((resolve) => setTimeout(resolve, 200));
    subscription.unsubscribe();
    const seen = events.length;
    await new Promise((resolve) => setTimeout(resolve, 300));
    expect(events.length).toBe(seen);
  });

  it('should report an invalid design as an error', async () => {
    const message = await new Promise<string>((resolve) => {
      runner.run({ ...demoPressure, chain: [] }, { duration: 0.01 }).subscribe({ error: (e: Error) => resolve(e.message) });
    });
    expect(message).toContain('chain');
  });
});
