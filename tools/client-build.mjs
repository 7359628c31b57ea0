// Builds the Angular client when its sources are newer than the last build.
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { ROOT, run, say } from './setup.mjs';

const INPUTS = [
  'src',
  'shared',
  'fonts',
  'angular.json',
  'tsconfig.json',
  'tsconfig.app.json',
  'package-lock.json',
];

function newestMtime(path) {
  if (!existsSync(path)) return 0;
  const stat = statSync(path);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const entry of readdirSync(path)) newest = Math.max(newest, newestMtime(join(path, entry)));
  return newest;
}

/** The built client's index.html. */
export const CLIENT_INDEX = join(ROOT, 'dist', 'cellsmith', 'browser', 'index.html');

/** Builds the client (production configuration) unless the build is newer than every input. */
export function ensureClientBuild() {
  const built = existsSync(CLIENT_INDEX) ? statSync(CLIENT_INDEX).mtimeMs : 0;
  const sources = Math.max(...INPUTS.map((input) => newestMtime(join(ROOT, input))));
  if (built > sources) {
    say('client build is up to date');
    return;
  }
  say('building the client (ng build)…');
  run('npx', ['ng', 'build', '--configuration', 'production'], {
    env: { ...process.env, NG_CLI_ANALYTICS: 'false' },
  });
}
