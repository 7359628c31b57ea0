// Benchmark: a 1,000,000-row simulated log posted through HTTP to a real server (its own
// throwaway PostgreSQL), timed from the start of the upload to `ready`, with the server
// process's peak memory — next to the in-process ingest of the same file measured in the same
// run (bench/ingest-run.ts), the peer this figure is held against (goal: within 1.5×).
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { mkdtempSync, openAsBlob, readFileSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { projectRoot } from '../server/project-root';
import { DEMO_HATCH, ecuVeTable } from '../shared/sim';

const ROWS = Number(process.env['BENCH_UPLOAD_ROWS'] ?? 1_000_000);

interface PgTools {
  ensurePostgres(): string;
  initCluster(bin: string, dir: string): void;
  startCluster(bin: string, dir: string, port: number, extra?: string[]): void;
  stopCluster(bin: string, dir: string): void;
  ensureDatabase(bin: string, port: number, name: string): void;
  databaseUrl(port: number, name: string): string;
}

function freePort(): Promise<number> {
  return new Promise((resolvePort, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      probe.close(() => resolvePort(port));
    });
  });
}

/** A minimal browser-like client: keeps cookies and echoes the XSRF token. */
class Client {
  private readonly cookies = new Map<string, string>();
  constructor(private readonly base: string) {}

  async request(method: string, path: string, body?: unknown, form?: FormData): Promise<Response> {
    const headers: Record<string, string> = {
      cookie: [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; '),
    };
    const xsrf = this.cookies.get('XSRF-TOKEN');
    if (xsrf && method !== 'GET') headers['x-xsrf-token'] = decodeURIComponent(xsrf);
    if (body !== undefined) headers['content-type'] = 'application/json';
    const res = await fetch(this.base + path, {
      method,
      headers,
      body: form ?? (body === undefined ? undefined : JSON.stringify(body)),
    });
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const at = pair?.indexOf('=') ?? -1;
      if (pair && at > 0) this.cookies.set(pair.slice(0, at), pair.slice(at + 1));
    }
    return res;
  }

  async json<T>(method: string, path: string, body?: unknown, expected = 200): Promise<T> {
    const res = await this.request(method, path, body);
    if (res.status !== expected)
      throw new Error(`${method} ${path}: ${res.status} ${await res.text()}`);
    return (await res.json()) as T;
  }
}

function peakRssMiB(pid: number): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  const kb = Number(/VmHWM:\s+(\d+)/.exec(status)?.[1] ?? NaN);
  return kb / 1024;
}

async function waitForHealth(url: string, server: ChildProcess): Promise<void> {
  const deadline = Date.now() + 60_000;
  while (Date.now() < deadline) {
    if (server.exitCode !== null) throw new Error('the server exited');
    try {
      if ((await fetch(`${url}/api/health`)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error('the server did not come up');
}

async function main(): Promise<void> {
  const root = projectRoot();
  const csv = join(root, 'bench', '.cache', `ingest-${ROWS}.csv`);
  const ensure = spawnSync('node', ['tools/bench.mjs', 'ingest'], {
    cwd: root,
    env: { ...process.env, BENCH_INGEST_ROWS: String(ROWS) },
    encoding: 'utf8',
  });
  if (ensure.status !== 0) throw new Error(`ingest benchmark failed:\n${ensure.stderr}`);
  const ingestLine = ensure.stdout.trim().split('\n').pop() ?? '';
  const ingestSeconds = Number(/cellsmith ([\d.]+) s/.exec(ingestLine)?.[1]);

  const pg = (await import(join(root, 'tools', 'pg.mjs'))) as PgTools;
  const tmp = mkdtempSync(join(tmpdir(), 'cellsmith-bench-upload-'));
  spawnSync('chmod', ['755', tmp]);
  const bin = pg.ensurePostgres();
  const clusterDir = join(tmp, 'pg');
  const pgPort = await freePort();
  const port = await freePort();
  let server: ChildProcess | null = null;
  try {
    pg.initCluster(bin, clusterDir);
    pg.startCluster(bin, clusterDir, pgPort, ['fsync=off', 'synchronous_commit=off']);
    pg.ensureDatabase(bin, pgPort, 'cellsmith');
    const env = {
      ...process.env,
      NODE_ENV: 'production',
      HOST: '127.0.0.1',
      PORT: String(port),
      CELLSMITH_DATA_DIR: join(tmp, 'data'),
      DATABASE_URL: pg.databaseUrl(pgPort, 'cellsmith'),
    };
    spawnSync('node', ['--import', 'tsx', 'server/setup-cli.ts', '--no-garage'], {
      cwd: root,
      env,
      stdio: 'ignore',
    });
    server = spawn('node', ['--import', 'tsx', 'server/index.ts'], {
      cwd: root,
      env,
      stdio: 'ignore',
    });
    const url = `http://127.0.0.1:${port}`;
    await waitForHealth(url, server);

    const client = new Client(url);
    await client.request('GET', '/api/health');
    await client.json('POST', '/api/auth/login', {
      email: 'tuner@cellsmith.test',
      password: 'cellsmith-demo',
    });
    const vehicle = await client.json<{ id: string }>(
      'POST',
      '/api/vehicles',
      { label: 'Upload bench hatch', engine: DEMO_HATCH.engine, gearing: DEMO_HATCH.gearing },
      201,
    );
    const start = ecuVeTable(DEMO_HATCH);
    await client.json(
      'POST',
      `/api/vehicles/${vehicle.id}/tables`,
      { name: 'Main VE', ...start },
      201,
    );
    const form = new FormData();
    form.set('kind', 'road');
    form.set('file', await openAsBlob(csv), `bench-${ROWS}.csv`);
    const began = performance.now();
    const res = await client.request('POST', `/api/vehicles/${vehicle.id}/logs`, undefined, form);
    if (res.status !== 202) throw new Error(`upload: ${res.status} ${await res.text()}`);
    const accepted = (performance.now() - began) / 1000;
    const { id } = (await res.json()) as { id: string };
    let log: { status: string; sampleCount: number | null } = {
      status: 'queued',
      sampleCount: null,
    };
    while (log.status !== 'ready' && log.status !== 'failed') {
      await new Promise((r) => setTimeout(r, 100));
      log = await client.json('GET', `/api/logs/${id}`);
    }
    const ready = (performance.now() - began) / 1000;
    const peak = peakRssMiB(server.pid as number);
    console.log(`${ingestLine}`);
    console.log(
      `upload of ${ROWS} rows: 202 after ${accepted.toFixed(2)} s, ${log.status} (${log.sampleCount} samples) after ${ready.toFixed(2)} s; server peak ${peak.toFixed(0)} MiB`,
    );
    console.log(
      `upload: cellsmith ${ready.toFixed(2)} s to ready, in-process ingest ${ingestSeconds.toFixed(2)} s, ratio ${(ready / ingestSeconds).toFixed(2)}; server peak ${peak.toFixed(0)} MiB`,
    );
  } finally {
    server?.kill('SIGTERM');
    await new Promise((r) => setTimeout(r, 1000));
    pg.stopCluster(bin, clusterDir);
    rmSync(tmp, { recursive: true, force: true });
  }
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
