// Machine set-up shared by `npm start` and `npm test`: plain Node, no dependencies, because it
// runs before `node_modules` exists.
import { spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The project's root folder. */
export const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');

/** Whether this process runs as root (and so may install Debian packages). */
export const IS_ROOT = typeof process.getuid === 'function' && process.getuid() === 0;

/** Prints one line of progress, prefixed so it stands out from child output. */
export function say(message) {
  process.stdout.write(`[cellsmith] ${message}\n`);
}

/** Runs a command to completion with inherited output; throws on a non-zero exit. */
export function run(command, args, options = {}) {
  const result = spawnSync(command, args, { stdio: 'inherit', cwd: ROOT, ...options });
  if (result.error) throw result.error;
  if (result.status !== 0) {
    throw new Error(`${command} ${args.join(' ')} exited with ${result.status ?? result.signal}`);
  }
  return result;
}

/** Installs npm dependencies when they are missing or older than the lock file. */
export function ensureNodeModules() {
  const marker = join(ROOT, 'node_modules', '.package-lock.json');
  const lock = join(ROOT, 'package-lock.json');
  if (existsSync(marker) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs) return;
  say('installing npm dependencies (npm ci)…');
  run('npm', ['ci', '--no-audit', '--no-fund']);
}

let aptUpdated = false;

/**
 * Makes sure a Debian package is installed. As root it installs it with apt-get; otherwise it
 * stops with a message naming the package to install.
 */
export function ensureDebianPackage(pkg, isPresent, why) {
  if (isPresent()) return;
  if (!IS_ROOT) {
    throw new Error(
      `${why} needs Debian's "${pkg}" package, which is not installed. ` +
        `Install it as root (apt-get install -y ${pkg}) and run this command again.`,
    );
  }
  say(`installing Debian package ${pkg} (${why})…`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  if (!aptUpdated) {
    run('apt-get', ['update', '-q'], { env });
    aptUpdated = true;
  }
  // policy-rc.d keeps apt from trying to start the distribution's own cluster service.
  run('apt-get', ['install', '-y', '-q', '--no-install-recommends', pkg], { env });
  if (!isPresent()) throw new Error(`apt-get installed ${pkg} but it still cannot be found`);
}
