import { describe, expect, test } from 'vitest';
import { ConfigSchema } from '../../../src/server/config';
import { NON_PAGE_POLICY, pagePolicy, securityHeaders, storageOrigin } from '../../../src/server/http/security-headers';

const STORAGE = 'https://objects.lightyard.example';
const opts = { storageOrigin: STORAGE, https: false, dev: false };
const directive = (policy: string, name: string) =>
  policy
    .split(';')
    .map((p) => p.trim().split(/\s+/))
    .find(([n]) => n === name)
    ?.slice(1);

describe('the page policy', () => {
  test("keeps Astro's hashes and nothing else Astro's header might carry", () => {
    const astro =
      "script-src 'self' 'unsafe-inline' 'unsafe-eval' https://cdn.example 'sha256-abc+/=' 'strict-dynamic'; style-src 'unsafe-inline' 'sha384-def='; img-src *";
    const policy = pagePolicy(astro, opts);
    expect(directive(policy, 'script-src')).toEqual(["'self'", "'sha256-abc+/='"]);
    expect(directive(policy, 'style-src')).toEqual(["'self'", "'sha384-def='"]);
    expect(directive(policy, 'img-src')).toEqual(["'self'", 'data:', 'blob:', STORAGE]);
  });

  test('without an Astro header scripts and styles come from the app only', () => {
    const policy = pagePolicy(null, opts);
    expect(directive(policy, 'script-src')).toEqual(["'self'"]);
    expect(directive(policy, 'style-src')).toEqual(["'self'"]);
    expect(directive(policy, 'frame-ancestors')).toEqual(["'none'"]);
    expect(directive(policy, 'object-src')).toEqual(["'none'"]);
  });
});

describe('securityHeaders', () => {
  test('HTML gets the page policy, anything else the policy that allows nothing', () => {
    expect(securityHeaders('text/html; charset=utf-8', null, opts)['content-security-policy']).toBe(pagePolicy(null, opts));
    expect(securityHeaders('application/json', null, opts)['content-security-policy']).toBe(NON_PAGE_POLICY);
    expect(securityHeaders(null, null, opts)['content-security-policy']).toBe(NON_PAGE_POLICY);
  });

  test('HSTS only for an https app', () => {
    expect(securityHeaders('text/html', null, opts)).not.toHaveProperty('strict-transport-security');
    expect(securityHeaders('text/html', null, { ...opts, https: true })['strict-transport-security']).toBe('max-age=31536000');
  });

  test('the dev server gets every header but the CSP', () => {
    const headers = securityHeaders('text/html', null, { ...opts, dev: true });
    expect(headers).not.toHaveProperty('content-security-policy');
    expect(headers['x-content-type-options']).toBe('nosniff');
  });
});

test('the storage origin is the configured endpoint, else the SDK’s regional endpoint', () => {
  expect(storageOrigin(ConfigSchema.parse({ S3_ENDPOINT: 'http://127.0.0.1:9000/' }))).toBe('http://127.0.0.1:9000');
  expect(storageOrigin(ConfigSchema.parse({ S3_REGION: 'eu-west-3' }))).toBe('https://s3.eu-west-3.amazonaws.com');
});
