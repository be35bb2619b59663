import { describe, expect, test } from 'vitest';
import { SignInSchema, SignUpSchema } from '../../../src/lib/schemas/auth';
import { CreateLabSchema } from '../../../src/lib/schemas/labs';
import { safeNext } from '../../../src/lib/safe-next';

describe('account schemas', () => {
  test('e-mail addresses are trimmed and lower-cased so one person has one account', () => {
    expect(SignInSchema.parse({ email: '  Ada@Lab.Example ', password: 'x' }).email).toBe('ada@lab.example');
  });
  test('sign-up names each bad field', () => {
    const r = SignUpSchema.safeParse({ email: 'not-an-address', password: 'short', name: ' ' });
    expect(r.success).toBe(false);
    const paths = r.success ? [] : r.error.issues.map((i) => i.path[0]);
    expect(new Set(paths)).toEqual(new Set(['email', 'password', 'name']));
  });
  test('a lab needs a two-letter country code, upper-cased', () => {
    expect(CreateLabSchema.parse({ name: 'Cavity Lab', institute: 'Inst', country: 'de' }).country).toBe('DE');
    expect(CreateLabSchema.safeParse({ name: 'Cavity Lab', institute: 'Inst', country: 'Germany' }).success).toBe(false);
  });
});

describe('safeNext', () => {
  test('follows same-site paths only', () => {
    expect(safeNext('/admin?x=1')).toBe('/admin?x=1');
    expect(safeNext('//evil.example/')).toBe('/account');
    expect(safeNext('https://evil.example/')).toBe('/account');
    expect(safeNext('/\\evil.example')).toBe('/account');
    expect(safeNext(null)).toBe('/account');
  });
});
