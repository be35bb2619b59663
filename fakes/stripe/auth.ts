import { invalidApiKey, missingApiKey } from './errors';

// Only test-mode keys: a live key pointed at the fake is a configuration mistake worth failing on.
const TEST_KEY = /^(?:sk|rk)_test_[A-Za-z0-9_]+$/;

function keyFromHeader(authorization: string): string {
  const [scheme = '', credentials = ''] = authorization.trim().split(/\s+/, 2);
  if (scheme.toLowerCase() === 'bearer') return credentials;
  // `curl -u sk_test_...:` sends the key as the Basic user name, which the provider accepts too.
  if (scheme.toLowerCase() === 'basic') {
    return Buffer.from(credentials, 'base64').toString('utf8').split(':')[0] ?? '';
  }
  return '';
}

/** The request's test-mode secret or restricted key; the provider's 401 for anything else. */
export function requireTestModeKey(authorization: string | undefined): string {
  const key = authorization ? keyFromHeader(authorization) : '';
  if (key === '') throw missingApiKey();
  if (!TEST_KEY.test(key)) throw invalidApiKey(key);
  return key;
}
