/**
 * The security headers of every response the app renders: pages, API answers, redirects and error pages.
 * The middleware applies them last, to whatever the route (or the middleware itself) answered.
 *
 * Pages get a Content-Security-Policy built here. Astro (`experimental.csp`) hashes the scripts and styles it
 * inlines (island hydration, the island styles, small stylesheets) and sends them in its own header; only
 * those hashes are taken from it, so no configuration can slip 'unsafe-inline' into script-src or style-src
 * (only style attributes get it, in style-src-attr: see below).
 * Images and uploads reach object storage (presigned GETs behind the /api/files redirect, browser PUTs), so
 * its origin is allowed for img-src and connect-src; it is only known at run time, from S3_ENDPOINT.
 * Anything else (JSON, redirects, plain text) gets a policy that allows nothing, since it never runs as a page.
 */
import { getConfig, isSecureOrigin, type Config } from '../config';

export interface SecurityOptions {
  /** The object-storage origin the browser talks to (presigned URLs). */
  storageOrigin: string;
  /** True when the app is served over https: adds HSTS. */
  https: boolean;
  /**
   * The dev server injects inline scripts and styles that Astro does not hash (Vite's client, CSS as <style>),
   * so it gets no CSP at all; the built server always does.
   */
  dev: boolean;
}

/** Where presigned URLs point: S3_ENDPOINT, or the SDK's path-style AWS endpoint for the region. */
export function storageOrigin(config: Config): string {
  return config.S3_ENDPOINT ? new URL(config.S3_ENDPOINT).origin : `https://s3.${config.S3_REGION}.amazonaws.com`;
}

/** Hash sources ('sha256-…') of one directive in a policy string. */
function hashesIn(policy: string | null, directive: string): string[] {
  for (const part of (policy ?? '').split(';')) {
    const [name, ...sources] = part.trim().split(/\s+/);
    if (name === directive) return sources.filter((s) => /^'sha(256|384|512)-[A-Za-z0-9+/=]+'$/.test(s));
  }
  return [];
}

/** The page policy; `astroPolicy` is the header Astro rendered for the page (its hashes are kept). */
export function pagePolicy(astroPolicy: string | null, opts: Pick<SecurityOptions, 'storageOrigin'>): string {
  const directives: [string, ...string[]][] = [
    ['default-src', "'self'"],
    ['script-src', "'self'", ...hashesIn(astroPolicy, 'script-src')],
    ['style-src', "'self'", ...hashesIn(astroPolicy, 'style-src')],
    // React islands render `style` props into the server HTML (a fit report's bar, a wavelength's colour), with
    // values computed per request, so they cannot be hashed. Style attributes cannot run script and their url()s
    // are still bound by img-src; <style> elements and stylesheets stay limited to 'self' and hashes above.
    ['style-src-attr', "'unsafe-inline'"],
    ['img-src', "'self'", 'data:', 'blob:', opts.storageOrigin],
    ['connect-src', "'self'", opts.storageOrigin],
    ['form-action', "'self'"],
    ['frame-ancestors', "'none'"],
    ['base-uri', "'self'"],
    ['object-src', "'none'"],
  ];
  return directives.map((d) => d.join(' ')).join('; ');
}

/** For responses that are not HTML: nothing may load, frame or submit from them. */
export const NON_PAGE_POLICY = "default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'";

/** The headers for a response of this content type; `astroPolicy` is Astro's CSP header on it, if any. */
export function securityHeaders(contentType: string | null, astroPolicy: string | null, opts: SecurityOptions): Record<string, string> {
  const headers: Record<string, string> = {
    'x-content-type-options': 'nosniff',
    'referrer-policy': 'strict-origin-when-cross-origin',
    // The app uses none of these; denying them keeps an injected frame or script from asking for them.
    'permissions-policy': 'camera=(), microphone=(), geolocation=(), payment=(), usb=()',
  };
  if (!opts.dev) {
    headers['content-security-policy'] = /^text\/html\b/i.test(contentType ?? '') ? pagePolicy(astroPolicy, opts) : NON_PAGE_POLICY;
  }
  // One year; not includeSubDomains, since the app cannot know what else runs under its host's sub-domains.
  if (opts.https) headers['strict-transport-security'] = 'max-age=31536000';
  return headers;
}

let options: SecurityOptions | undefined;
function currentOptions(): SecurityOptions {
  if (!options) {
    const config = getConfig();
    options = { storageOrigin: storageOrigin(config), https: isSecureOrigin(config), dev: import.meta.env.DEV };
  }
  return options;
}

/** Sets the headers on the response, or on a copy when its headers are immutable (as on a Response.redirect()). */
export function withSecurityHeaders(response: Response): Response {
  const headers = securityHeaders(response.headers.get('content-type'), response.headers.get('content-security-policy'), currentOptions());
  const apply = (target: Response) => {
    for (const [name, value] of Object.entries(headers)) target.headers.set(name, value);
    return target;
  };
  try {
    return apply(response);
  } catch {
    return apply(new Response(response.body, response));
  }
}
