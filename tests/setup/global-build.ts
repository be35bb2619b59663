import { spawnSync } from 'node:child_process';

/** Integration tests run the built server; `npm test` builds once beforehand and sets LIGHTYARD_SKIP_BUILD. */
export default function setup() {
  if (process.env.LIGHTYARD_SKIP_BUILD === '1') return;
  const r = spawnSync(process.execPath, ['node_modules/astro/astro.js', 'build'], { stdio: 'inherit' });
  if (r.status !== 0) throw new Error('astro build failed');
}
