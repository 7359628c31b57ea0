// A project-local PostgreSQL cluster on loopback: find the binaries, create, start, stop.
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { chownSync, existsSync, mkdirSync, readdirSync, chmodSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { IS_ROOT, ensureDebianPackage, say } from './setup.mjs';

/** The folder of the newest installed PostgreSQL server binaries, or null. */
export function findPgBin() {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return null;
  const versions = readdirSync(base)
    .filter((name) => existsSync(join(base, name, 'bin', 'pg_ctl')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? join(base, versions[0], 'bin') : null;
}

/** Installs Debian's postgresql when missing (as root) and returns its binaries' folder. */
export function ensurePostgres() {
  ensureDebianPackage('postgresql', () => findPgBin() !== null, 'the database');
  return findPgBin();
}

function postgresIds() {
  const id = (flag) => spawnSync('id', [flag, 'postgres'], { encoding: 'utf8' });
  const uid = id('-u');
  const gid = id('-g');
  if (uid.status !== 0) throw new Error('the "postgres" system user is missing');
  return { uid: Number(uid.stdout.trim()), gid: Number(gid.stdout.trim()) };
}

/**
 * Where root keeps a cluster whose data folder the postgres user cannot reach (a checkout in
 * `/root`, mode 700): a folder of its own under the system's state directory.
 */
export const SYSTEM_CLUSTERS_DIR =
  process.env.CELLSMITH_SYSTEM_CLUSTERS_DIR || '/var/lib/cellsmith';

/** Whether the postgres user can enter `dir` (every folder above it searchable). */
function postgresCanEnter(dir) {
  if (!existsSync(dir)) return false;
  return spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-x', dir]).status === 0;
}

/**
 * The cluster folder kept outside `dataDir` for this data folder: named after the folder's last
 * part (ASCII only, so spaces and accents in the path never reach PostgreSQL's own files) and a
 * hash of its whole path, so two checkouts never share one.
 */
export function systemClusterDir(dataDir) {
  const hash = createHash('sha256').update(dataDir).digest('hex').slice(0, 12);
  const named = basename(dataDir) === '.data' ? basename(dirname(dataDir)) : basename(dataDir);
  const project = named
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^A-Za-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 40)
    .toLowerCase();
  return join(SYSTEM_CLUSTERS_DIR, `pg-${project || 'data'}-${hash}`);
}

/**
 * The folder of the cluster that belongs to `dataDir`: `<dataDir>/pg`, except when root runs us
 * and the postgres user cannot enter `dataDir` (PostgreSQL refuses to run as root, so it runs as
 * postgres). Then the cluster lives in `systemClusterDir(dataDir)` and only the cluster moves:
 * uploads, mail and the session secret stay in `dataDir`, and no folder of the user's is opened
 * up. The answer depends only on the path and its permissions, so `db:stop` finds it again.
 */
export function clusterDirFor(dataDir) {
  const local = join(dataDir, 'pg');
  if (!IS_ROOT || postgresCanEnter(dataDir)) return local;
  return systemClusterDir(dataDir);
}

/** Runs a PostgreSQL binary, as the postgres user when we are root (initdb refuses root). */
function pgRun(bin, tool, args, { quiet = false } = {}) {
  const command = IS_ROOT ? 'runuser' : join(bin, tool);
  const fullArgs = IS_ROOT ? ['-u', 'postgres', '--', join(bin, tool), ...args] : args;
  return spawnSync(command, fullArgs, {
    encoding: 'utf8',
    stdio: quiet ? 'pipe' : ['ignore', 'pipe', 'pipe'],
  });
}

function check(result, what) {
  if (result.error) throw result.error;
  if (result.status !== 0) {
    throw new Error(`${what} failed (exit ${result.status}):\n${result.stdout}\n${result.stderr}`);
  }
  return result;
}

/** Creates the cluster in `dir` unless one is there already. */
export function initCluster(bin, dir) {
  if (existsSync(join(dir, 'PG_VERSION'))) return false;
  if (IS_ROOT && dir.startsWith(SYSTEM_CLUSTERS_DIR)) {
    mkdirSync(SYSTEM_CLUSTERS_DIR, { recursive: true, mode: 0o755 });
    chmodSync(SYSTEM_CLUSTERS_DIR, 0o755);
  }
  mkdirSync(dir, { recursive: true, mode: 0o700 });
  if (IS_ROOT) {
    const { uid, gid } = postgresIds();
    chownSync(dir, uid, gid);
    chmodSync(dir, 0o700);
    const reach = spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-w', dir]);
    if (reach.status !== 0) {
      throw new Error(
        `the postgres user cannot reach ${dir}: make every folder above it searchable ` +
          `(chmod o+x) or set CELLSMITH_DATA_DIR to a folder it can reach`,
      );
    }
  }
  say(`creating the database cluster in ${dir}…`);
  check(
    pgRun(
      bin,
      'initdb',
      ['-D', dir, '-U', 'postgres', '-A', 'trust', '-E', 'UTF8', '--locale=C', '--no-sync'],
      {
        quiet: true,
      },
    ),
    'initdb',
  );
  return true;
}

/** Whether a postmaster is running on the cluster in `dir`. */
export function isClusterRunning(bin, dir) {
  if (!existsSync(join(dir, 'postmaster.pid'))) return false;
  return pgRun(bin, 'pg_ctl', ['-D', dir, 'status'], { quiet: true }).status === 0;
}

/**
 * Starts the cluster in `dir` on 127.0.0.1:`port` with no Unix socket (long data paths and a
 * shared /var/run stay out of the way). `extra` adds server settings, e.g. fsync=off in tests.
 */
export function startCluster(bin, dir, port, extra = []) {
  const options = [
    '-c listen_addresses=127.0.0.1',
    `-p ${port}`,
    "-c unix_socket_directories=''",
    ...extra.map((setting) => `-c ${setting}`),
  ].join(' ');
  check(
    pgRun(
      bin,
      'pg_ctl',
      ['-D', dir, '-l', join(dir, 'postgres.log'), '-w', '-t', '60', '-o', options, 'start'],
      {
        quiet: true,
      },
    ),
    `starting PostgreSQL on 127.0.0.1:${port} (see ${join(dir, 'postgres.log')})`,
  );
}

/** Stops the cluster in `dir` (fast shutdown: open sessions are ended). */
export function stopCluster(bin, dir) {
  if (!isClusterRunning(bin, dir)) return false;
  check(
    pgRun(bin, 'pg_ctl', ['-D', dir, '-m', 'fast', '-w', 'stop'], { quiet: true }),
    'stopping PostgreSQL',
  );
  return true;
}

/** Creates database `name` on the cluster at `port` unless it exists. */
export function ensureDatabase(bin, port, name) {
  const psql = (sql) =>
    spawnSync(
      join(bin, 'psql'),
      ['-h', '127.0.0.1', '-p', String(port), '-U', 'postgres', '-d', 'postgres', '-tAc', sql],
      {
        encoding: 'utf8',
      },
    );
  const found = check(
    psql(`SELECT 1 FROM pg_database WHERE datname = '${name}'`),
    'looking up the database',
  );
  if (found.stdout.trim() === '1') return false;
  check(psql(`CREATE DATABASE "${name}"`), `creating database ${name}`);
  return true;
}

/** The connection URL of database `name` on the local cluster. */
export function databaseUrl(port, name) {
  return `postgres://postgres@127.0.0.1:${port}/${name}`;
}
