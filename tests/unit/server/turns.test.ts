import { describe, expect, test } from 'vitest';
import { fifoLimiter } from '../../../src/server/turns';

const tick = () => new Promise((r) => setTimeout(r, 1));

describe('fifoLimiter', () => {
  test('never runs more than its slots at once, and starts the waiting ones in arrival order', async () => {
    const limit = fifoLimiter(2);
    let running = 0;
    let most = 0;
    const started: number[] = [];
    const results = await Promise.all(
      Array.from({ length: 12 }, (_, i) =>
        limit(async () => {
          started.push(i);
          most = Math.max(most, ++running);
          // later arrivals finish sooner: the order of starts must still be the order of arrival
          for (let k = 0; k < 12 - i; k++) await tick();
          running--;
          return i * 10;
        }),
      ),
    );
    expect(most).toBe(2);
    expect(started).toEqual([...Array(12).keys()]);
    expect(results).toEqual(Array.from({ length: 12 }, (_, i) => i * 10));
  });

  test('a failing piece of work passes its slot on', async () => {
    const limit = fifoLimiter(1);
    const failed = limit(async () => {
      throw new Error('no');
    });
    const next = limit(async () => 'ran');
    await expect(failed).rejects.toThrow('no');
    await expect(next).resolves.toBe('ran');
  });
});
