import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { projectRoot } from '../../server/project-root';

/**
 * The built client's initial JavaScript: what a browser must fetch before the first page shows.
 * The issue sets the goal at 350 kB gzip; Angular's budgets in angular.json count raw bytes, so
 * the compressed figure is checked here, on the build `npm test` made.
 */
const INITIAL_GZIP_LIMIT_BYTES = 350_000;

/** Markers of the heavy libraries that must stay on the routes that need them. */
const LAZY_MARKERS = {
  grid: 'ag-root-wrapper',
  charts: '_echarts_instance_',
} as const;

const dist = process.env['CLIENT_DIST'] ?? join(projectRoot(), 'dist', 'cellsmith', 'browser');

/** `main` and every chunk it imports statically, transitively (dynamic `import()` excluded). */
function initialFiles(): string[] {
  const html = readFileSync(join(dist, 'index.html'), 'utf8');
  const main = /<script src="([\w.-]+\.js)" type="module"/.exec(html)?.[1];
  if (!main) throw new Error('index.html has no main module script');
  const seen = new Set<string>([main]);
  const queue = [main];
  while (queue.length > 0) {
    const file = queue.pop() as string;
    const code = readFileSync(join(dist, file), 'utf8');
    // Static imports read `from"./chunk-X.js"` or `import"./chunk-X.js"`; a dynamic import has
    // a parenthesis between `import` and the quote, so it does not match.
    for (const match of code.matchAll(/(?:from|import)\s*["']\.\/([\w.-]+\.js)["']/g)) {
      const next = match[1] as string;
      if (!seen.has(next)) {
        seen.add(next);
        queue.push(next);
      }
    }
  }
  return [...seen];
}

describe('the built client', () => {
  beforeAll(() => {
    if (!existsSync(join(dist, 'index.html'))) {
      throw new Error('the client is not built: `npm test` builds it before the browser tests');
    }
  });

  it('When the initial JavaScript is gzipped, then it stays within 350 kB', () => {
    const bytes = initialFiles().reduce(
      (sum, file) => sum + gzipSync(readFileSync(join(dist, file)), { level: 9 }).length,
      0,
    );
    expect(bytes).toBeGreaterThan(50_000); // the app itself is there
    expect(bytes).toBeLessThanOrEqual(INITIAL_GZIP_LIMIT_BYTES);
  });

  it.each(Object.entries(LAZY_MARKERS))(
    'When the initial chunks are read, then the %s library is not among them (it is lazy)',
    (_name, marker) => {
      const initial = new Set(initialFiles());
      const holders = readdirSync(dist)
        .filter((f) => f.endsWith('.js'))
        .filter((f) => readFileSync(join(dist, f), 'utf8').includes(marker));
      expect(holders.length).toBeGreaterThan(0); // the marker still finds the library
      expect(holders.filter((f) => initial.has(f))).toEqual([]);
    },
  );
});
