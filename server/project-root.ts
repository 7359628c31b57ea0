import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';

let cached: string | undefined;

/**
 * The project's root folder: the nearest folder above this file whose package.json is
 * Cellsmith's. Found by walking up, so it holds wherever the server code is run from.
 */
export function projectRoot(): string {
  if (cached) return cached;
  let dir = __dirname;
  for (;;) {
    const manifest = join(dir, 'package.json');
    if (existsSync(manifest)) {
      const { name } = JSON.parse(readFileSync(manifest, 'utf8')) as { name?: string };
      if (name === 'cellsmith') return (cached = dir);
    }
    const parent = dirname(dir);
    if (parent === dir)
      throw new Error('Cellsmith: cannot find the project root above ' + __dirname);
    dir = parent;
  }
}
