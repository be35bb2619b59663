/**
 * The app's routes as Astro sees them, read from src/pages at test time, so that a route someone adds
 * shows up in the access matrix and the fuzzing without anybody typing it into a list.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative, sep } from 'node:path';

const HTTP_METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE', 'ALL'] as const;
export type HttpMethod = (typeof HTTP_METHODS)[number];

export interface RouteHandler {
  method: HttpMethod;
  /** The exported handler reads a JSON body through readJson (so 415 / 413 / 400 apply once its guard passes). */
  readsJson: boolean;
  /** The handler reads the body itself, past readJson and its limits (the payment webhook, to check a signature over it). */
  readsRawBody: boolean;
}

export interface DiscoveredRoute {
  file: string;
  /** The path pattern in Astro's file syntax: /api/listings/[id], /api/[...rest], /. */
  pattern: string;
  kind: 'api' | 'page';
  /** Names of the dynamic segments, in order; a rest parameter keeps its dots: `...rest`. */
  params: string[];
  handlers: RouteHandler[];
}

const PAGES_DIR = 'src/pages';
const ROUTE_FILE = /\.(ts|js|mjs|astro|md|mdx|html)$/;
const ENDPOINT_FILE = /\.(ts|js|mjs)$/;

function walk(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    // Astro ignores files and folders whose name starts with an underscore
    if (entry.name.startsWith('_')) return [];
    const full = join(dir, entry.name);
    if (entry.isDirectory()) return walk(full);
    return ROUTE_FILE.test(entry.name) ? [full] : [];
  });
}

function patternOf(file: string, root: string): string {
  const rel = relative(root, file).split(sep).join('/').replace(ROUTE_FILE, '');
  return `/${rel}`.replace(/\/index$/, '') || '/';
}

/** The exported handlers, each judged by its text: from its `export` to the next top-level `export` (or the end). */
function handlersOf(source: string): RouteHandler[] {
  const exportAt = /^export\s+(?:const|let|var|async\s+function|function)\s+(\w+)/gm;
  const starts = [...source.matchAll(exportAt)].map((m) => ({ name: m[1]!, at: m.index! }));
  const reexports = [...source.matchAll(/^export\s*\{([^}]*)\}/gm)].flatMap((m) =>
    m[1]!.split(',').map((part) => ({
      name: part
        .trim()
        .split(/\s+as\s+/)
        .pop()!,
      at: m.index!,
    })),
  );
  const all = [...starts, ...reexports].sort((a, b) => a.at - b.at);
  return all
    .filter((e): e is { name: HttpMethod; at: number } => (HTTP_METHODS as readonly string[]).includes(e.name))
    .map((e) => {
      const next = all.find((o) => o.at > e.at)?.at ?? source.length;
      const own = source.slice(e.at, next);
      // a handler whose body is defined elsewhere in the file (`export const ALL = unknown`) is judged by the whole file
      const block = /=>|function/.test(own) ? own : source;
      return {
        method: e.name,
        readsJson: /\breadJson\(/.test(block),
        readsRawBody: /\b(request\.(text|json|arrayBuffer|blob|formData)|readLimited)\(/.test(block),
      };
    });
}

/** A page answers GET, and any other method its frontmatter tests for (`Astro.request.method === 'POST'`). */
function pageHandlers(source: string): RouteHandler[] {
  const tested = [...source.matchAll(/Astro\.request\.method\s*===?\s*['"](\w+)['"]/g)].map((m) => m[1]!.toUpperCase());
  const methods = [...new Set(['GET', ...tested])].filter((m): m is HttpMethod => (HTTP_METHODS as readonly string[]).includes(m));
  return methods.map((method) => ({
    method,
    readsJson: false,
    readsRawBody: method !== 'GET' && /\brequest\.(text|arrayBuffer|blob|formData)\(/.test(source),
  }));
}

export function discoverRoutes(root = PAGES_DIR): DiscoveredRoute[] {
  return walk(root)
    .map((file) => {
      const pattern = patternOf(file, root);
      const params = [...pattern.matchAll(/\[([^\]]+)\]/g)].map((m) => m[1]!);
      const source = readFileSync(file, 'utf8');
      const handlers: RouteHandler[] = ENDPOINT_FILE.test(file) ? handlersOf(source) : pageHandlers(source);
      return { file, pattern, kind: pattern === '/api' || pattern.startsWith('/api/') ? 'api' : 'page', params, handlers } as const;
    })
    .sort((a, b) => a.pattern.localeCompare(b.pattern));
}

/** `GET /api/listings/[id]`: the key a table row and a discovered handler share. */
export const routeKey = (method: string, pattern: string) => `${method} ${pattern}`;
