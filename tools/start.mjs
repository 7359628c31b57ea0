// `npm start`: installs what is missing, starts PostgreSQL on loopback, migrates, seeds the
// demo shop, builds the client and serves app + API from one process until SIGINT/SIGTERM.
import { spawn } from 'node:child_process';
import { chmodSync, mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { ensureClientBuild } from './client-build.mjs';
import {
  clusterDirFor,
  databaseUrl,
  ensureDatabase,
  ensurePostgres,
  initCluster,
  isClusterRunning,
  startCluster,
  stopCluster,
} from './pg.mjs';
import { IS_ROOT, ROOT, ensureNodeModules, run, say } from './setup.mjs';

const host = process.env.HOST || '127.0.0.1';
const port = Number(process.env.PORT || 4310);
const pgPort = Number(process.env.PGPORT || 54329);
const dataDir = resolve(ROOT, process.env.CELLSMITH_DATA_DIR || '.data');
let clusterDir = join(dataDir, 'pg');

let bin = null;
let startedCluster = false;
let server = null;
let stopping = false;

function stopDatabase() {
  if (startedCluster && bin) {
    say('stopping PostgreSQL…');
    stopCluster(bin, clusterDir);
    startedCluster = false;
  }
}

async function waitForHealth(url, timeoutMs) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (server?.exitCode !== null && server?.exitCode !== undefined) return false;
    try {
      const res = await fetch(url);
      if (res.ok) return true;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  return false;
}

function shutdown(signal) {
  if (stopping) return;
  stopping = true;
  say(`${signal}: shutting down…`);
  if (server && server.exitCode === null) {
    server.once('exit', () => {
      stopDatabase();
      process.exit(0);
    });
    server.kill('SIGTERM');
  } else {
    stopDatabase();
    process.exit(0);
  }
}

async function main() {
  process.on('SIGINT', () => shutdown('SIGINT'));
  process.on('SIGTERM', () => shutdown('SIGTERM'));
  process.on('SIGHUP', () => shutdown('SIGHUP'));
  // If whoever started us dies without a signal reaching us, do not leave things running.
  const parent = process.ppid;
  setInterval(() => {
    if (process.ppid !== parent) shutdown('parent process gone');
  }, 1000).unref();

  ensureNodeModules();
  bin = ensurePostgres();
  mkdirSync(dataDir, { recursive: true });
  if (IS_ROOT) chmodSync(dataDir, 0o755);
  clusterDir = clusterDirFor(dataDir);
  if (clusterDir !== join(dataDir, 'pg')) {
    say(
      `the postgres user cannot enter ${dataDir}; the database cluster is kept in ` +
        `${clusterDir} instead (uploads, mail and the session secret stay in the data folder)`,
    );
  }
  say(`database cluster: ${clusterDir}`);
  initCluster(bin, clusterDir);
  if (isClusterRunning(bin, clusterDir)) {
    say(`PostgreSQL is already running in ${clusterDir}; using it (it will be left running)`);
  } else {
    say(`starting PostgreSQL on 127.0.0.1:${pgPort}…`);
    startCluster(bin, clusterDir, pgPort);
    startedCluster = true;
  }
  ensureDatabase(bin, pgPort, 'cellsmith');
  const env = {
    ...process.env,
    NODE_ENV: process.env.NODE_ENV || 'development',
    HOST: host,
    PORT: String(port),
    PGPORT: String(pgPort),
    CELLSMITH_DATA_DIR: dataDir,
    DATABASE_URL: process.env.DATABASE_URL || databaseUrl(pgPort, 'cellsmith'),
  };
  run('node', ['--import', 'tsx', 'server/setup-cli.ts'], { env });
  ensureClientBuild();
  if (stopping) return;

  server = spawn('node', ['--import', 'tsx', 'server/index.ts'], {
    cwd: ROOT,
    env,
    stdio: 'inherit',
  });
  server.on('exit', (code, signal) => {
    if (stopping) return;
    say(`the server stopped (${signal ?? code}); stopping`);
    stopDatabase();
    process.exit(code ?? 1);
  });
  const url = `http://${host}:${port}`;
  if (await waitForHealth(`${url}/api/health`, 60_000)) {
    say(`Cellsmith is running at ${url}  (Ctrl+C stops it and its database)`);
  } else if (!stopping) {
    say('the server did not answer /api/health within 60 s');
    shutdown('startup failure');
  }
}

main().catch((err) => {
  console.error(`[cellsmith] ${err instanceof Error ? err.message : err}`);
  stopDatabase();
  process.exit(1);
});
