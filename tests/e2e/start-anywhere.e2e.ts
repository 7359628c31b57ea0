import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import {
  chmodSync,
  cpSync,
  existsSync,
  mkdirSync,
  mkdtempSync,
  rmSync,
  statSync,
  symlinkSync,
  utimesSync,
} from 'node:fs';
import { createServer, type AddressInfo } from 'node:net';
import { homedir, tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { projectRoot } from '../../server/project-root';

/**
 * `npm start` from a fresh checkout in a private folder (mode 700, as a home folder is) whose
 * path has a space and an accent: as root the postgres user cannot enter it, so the cluster must
 * live elsewhere, be named in the output, and `npm run db:stop` must find it again.
 */

const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
const root = projectRoot();

function freePort(): Promise<number> {
  return new Promise((resolvePort, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as AddressInfo;
      probe.close(() => resolvePort(port));
    });
  });
}

/** The project's files as a clone has them: tracked and new, never ignored ones. */
function checkoutFiles(): string[] {
  const listed = spawnSync(
    'git',
    ['ls-files', '-z', '--cached', '--others', '--exclude-standard'],
    {
      cwd: root,
      encoding: 'utf8',
    },
  );
  if (listed.status !== 0) throw new Error(`git ls-files failed: ${listed.stderr}`);
  return listed.stdout.split('\0').filter((path) => path && existsSync(join(root, path)));
}

/**
 * A copy of the checkout in `dest`, timestamps kept. `node_modules` is linked and the client
 * build copied (with its times, so it stays newer than the sources): installing and building
 * are the slow steps that `npm test` itself has already proven.
 */
function cloneInto(dest: string): void {
  const folders = new Set<string>();
  for (const path of checkoutFiles()) {
    mkdirSync(dirname(join(dest, path)), { recursive: true });
    cpSync(join(root, path), join(dest, path), { preserveTimestamps: true });
    for (let dir = dirname(path); dir !== '.'; dir = dirname(dir)) folders.add(dir);
  }
  // Folder times count in the client-build check too: keep them as well.
  for (const dir of folders) {
    const { atime, mtime } = statSync(join(root, dir));
    utimesSync(join(dest, dir), atime, mtime);
  }
  symlinkSync(join(root, 'node_modules'), join(dest, 'node_modules'), 'dir');
  const dist = join(root, 'dist');
  if (existsSync(dist))
    cpSync(dist, join(dest, 'dist'), { recursive: true, preserveTimestamps: true });
}

async function waitFor(
  test: () => Promise<boolean> | boolean,
  timeoutMs: number,
): Promise<boolean> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (await test()) return true;
    await new Promise((r) => setTimeout(r, 500));
  }
  return false;
}

/** Whether any postgres process runs on the cluster folder `dir`. */
function postgresRunningIn(dir: string): boolean {
  const ps = spawnSync('ps', ['-eo', 'args'], { encoding: 'utf8' });
  return ps.stdout.split('\n').some((line) => /postgres/.test(line) && line.includes(dir));
}

describe('npm start in a private folder', () => {
  let base = '';
  let clone = '';
  let child: ChildProcess | undefined;
  let output = '';
  let clusterDir = '';

  beforeAll(() => {
    // Root's home is the usual private place; elsewhere the temp folder, made private alike.
    const parent = isRoot && existsSync(homedir()) ? homedir() : tmpdir();
    base = mkdtempSync(join(parent, 'cellsmith-private-'));
    chmodSync(base, 0o700);
    clone = join(base, 'my clone é');
    cloneInto(clone);
  });

  afterAll(() => {
    if (child && child.exitCode === null) child.kill('SIGKILL');
    if (clone) spawnSync('npm', ['run', 'db:stop'], { cwd: clone, encoding: 'utf8' });
    if (clusterDir && !clusterDir.startsWith(base))
      rmSync(clusterDir, { recursive: true, force: true });
    if (base) rmSync(base, { recursive: true, force: true });
  });

  it('When started as the machine user in a mode-700 folder, then it serves and stops cleanly', async () => {
    expect(statSync(base).mode & 0o777).toBe(0o700);
    const port = await freePort();
    const pgPort = await freePort();
    const env: NodeJS.ProcessEnv = { ...process.env, PORT: String(port), PGPORT: String(pgPort) };
    for (const name of ['CELLSMITH_DATA_DIR', 'DATABASE_URL', 'NODE_ENV', 'SESSION_SECRET']) {
      delete env[name];
    }
    child = spawn('npm', ['start'], { cwd: clone, env, stdio: ['ignore', 'pipe', 'pipe'] });
    child.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));

    const healthy = await waitFor(async () => {
      if (child?.exitCode !== null) return true;
      try {
        const res = await fetch(`http://127.0.0.1:${port}/api/health`);
        return res.ok;
      } catch {
        return false;
      }
    }, 170_000);
    if (!healthy || child.exitCode !== null)
      throw new Error(`npm start did not come up:\n${output}`);
    await waitFor(() => output.includes('Cellsmith is running at'), 10_000);

    clusterDir = /database cluster: (.+)/.exec(output)?.[1]?.trim() ?? '';
    expect(clusterDir).not.toBe('');
    if (isRoot) {
      // The user's folder is left as it was; the cluster sits where postgres can reach it.
      expect(statSync(base).mode & 0o777).toBe(0o700);
      expect(clusterDir.startsWith(base)).toBe(false);
      expect(clusterDir).toMatch(/^[\x20-\x7e]+$/);
      expect(output).toContain('the postgres user cannot enter');
    }
    expect(postgresRunningIn(clusterDir)).toBe(true);
    // Uploads, mail and the session secret stay in the checkout's own data folder.
    expect(existsSync(join(clone, '.data'))).toBe(true);

    const exited = new Promise<number | null>((resolveExit) =>
      child?.once('exit', (code) => resolveExit(code)),
    );
    child.kill('SIGTERM');
    expect(await exited).toBe(0);
    expect(await waitFor(() => !postgresRunningIn(clusterDir), 15_000)).toBe(true);

    // A cluster left running (started again by hand) is found and stopped by db:stop.
    const pgBin = spawnSync('sh', ['-c', 'ls -d /usr/lib/postgresql/*/bin | sort -V | tail -1'], {
      encoding: 'utf8',
    }).stdout.trim();
    // With a log file, pg_ctl's output pipes close once the server runs (spawnSync waits on them).
    const pgCtl = [
      join(pgBin, 'pg_ctl'),
      ...['-D', clusterDir, '-l', join(clusterDir, 'postgres.log'), '-w'],
      ...['-o', `-c listen_addresses=127.0.0.1 -p ${pgPort} -c unix_socket_directories=''`],
      'start',
    ];
    const started = isRoot
      ? spawnSync('runuser', ['-u', 'postgres', '--', ...pgCtl], { encoding: 'utf8' })
      : spawnSync(pgCtl[0] as string, pgCtl.slice(1), { encoding: 'utf8' });
    expect(started.status).toBe(0);
    expect(postgresRunningIn(clusterDir)).toBe(true);
    const stop = spawnSync('npm', ['run', 'db:stop'], { cwd: clone, env, encoding: 'utf8' });
    expect(stop.status).toBe(0);
    expect(stop.stdout).toContain(`stopped PostgreSQL in ${clusterDir}`);
    expect(await waitFor(() => !postgresRunningIn(clusterDir), 15_000)).toBe(true);
  }, 240_000);
});
