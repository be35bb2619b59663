import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwindcss from '@tailwindcss/vite';

// The router trusts a Host header only for these names (else it uses "localhost", and the origin check
// refuses same-site posts). Loopback for local use and tests; the production host comes from APP_ORIGIN
// (or ALLOWED_HOSTS, comma-separated) at build time.
const hostnames = new Set(['localhost', '127.0.0.1']);
if (process.env.APP_ORIGIN) hostnames.add(new URL(process.env.APP_ORIGIN).hostname);
for (const h of (process.env.ALLOWED_HOSTS ?? '').split(',')) if (h.trim()) hostnames.add(h.trim());

export default defineConfig({
  output: 'server',
  adapter: node({ mode: 'standalone' }),
  integrations: [react()],
  security: { checkOrigin: true, allowedDomains: [...hostnames].map((hostname) => ({ hostname })) },
  server: { host: '127.0.0.1', port: 4321 },
  devToolbar: { enabled: false },
  // Astro hashes the scripts and styles it inlines and sends them in a CSP header on each page;
  // src/server/http/security-headers.ts takes those hashes into the app's own policy.
  experimental: { csp: true },
  vite: {
    plugins: [tailwindcss()],
    ssr: { external: ['@node-rs/argon2', 'sharp', '@libsql/client', 'libsql'] },
  },
});
