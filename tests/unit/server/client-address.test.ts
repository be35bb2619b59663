// /dev/mail (sign-in and reset links of the local mail fake) answers only callers on this machine.
import { describe, expect, test } from 'vitest';
import { isLoopbackAddress } from '../../../src/server/http/client-address';

describe('isLoopbackAddress', () => {
  test.each(['127.0.0.1', '127.1.2.3', '::1', '::ffff:127.0.0.1', '::FFFF:127.0.0.1'])('%s is this machine', (a) => {
    expect(isLoopbackAddress(a)).toBe(true);
  });

  test.each(['192.0.2.2', '10.0.0.1', '::ffff:10.0.0.1', 'fd00::2', '', 'unknown', '127.0.0.1.example', '1127.0.0.1', '::11'])(
    '%s is another machine',
    (a) => {
      expect(isLoopbackAddress(a)).toBe(false);
    },
  );
});
