/**
 * At most `slots` pieces of async work at once; the rest wait in arrival order, and a slot passes on
 * when its work ends, thrown or not. For CPU-bound work (password hashing) under a burst of callers.
 */
export function fifoLimiter(slots: number): <T>(work: () => Promise<T>) => Promise<T> {
  let running = 0;
  const waiting: (() => void)[] = [];
  return async (work) => {
    if (running >= slots) await new Promise<void>((resolve) => waiting.push(resolve));
    else running++;
    try {
      return await work();
    } finally {
      const next = waiting.shift();
      if (next) next();
      else running--;
    }
  };
}
