/**
 * Work still running after its HTTP request was answered (Slack acknowledges events before the
 * reply is posted). On shutdown, the process waits for it before closing the store.
 */
const pending = new Set<Promise<unknown>>();

/** Runs `work` and remembers it until it settles. */
export function track<T>(work: () => Promise<T>): Promise<T> {
  const running = work();
  pending.add(running);
  running.then(
    () => pending.delete(running),
    () => pending.delete(running),
  );
  return running;
}

/** Waits for the work in flight to settle, at most `ms`. */
export async function drain(ms = 10_000): Promise<void> {
  if (pending.size === 0) return;
  let timer: NodeJS.Timeout | undefined;
  await Promise.race([
    Promise.allSettled([...pending]),
    new Promise((resolve) => {
      timer = setTimeout(resolve, ms);
    }),
  ]);
  clearTimeout(timer);
}

export function inFlight(): number {
  return pending.size;
}
