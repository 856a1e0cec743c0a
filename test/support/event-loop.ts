/**
 * Runs `work` and counts the turns the main thread's event loop made meanwhile: none when the work
 * held the thread the whole time, many when it ran elsewhere (a worker thread).
 */
export async function turnsDuring<T>(work: () => Promise<T>): Promise<{ value: T; turns: number }> {
  let turns = 0;
  let running = true;
  const counting = (async () => {
    while (running) {
      await new Promise((resolve) => setImmediate(resolve));
      turns += 1;
    }
  })();
  try {
    return { value: await work(), turns };
  } finally {
    running = false;
    await counting;
  }
}
