/**
 * Cooperative time slicing for long loops on the event loop. The embedded database answers
 * through promise callbacks without I/O, so a loop of awaited queries never lets timers or
 * sockets run by itself; `slice()` gives the loop a turn once `ms` have passed since the last.
 */
export function createSlicer(ms = 10): () => Promise<void> {
  let last = performance.now();
  return async () => {
    if (performance.now() - last < ms) return;
    await new Promise<void>((resolve) => setImmediate(resolve));
    last = performance.now();
  };
}
