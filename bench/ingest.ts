// Benchmark: ingesting a simulated log of 0.1 M, 1 M and 4 M rows — Cellsmith's stream parse +
// align + filter + accumulate against a peer measured in the same run on the same file:
// pandas.read_csv + the same filter + scipy.stats.binned_statistic_2d (bench/peer/ingest_peer.py,
// Debian's python3-pandas and python3-scipy, installed here when missing and we are root).
// Each side runs in its own process so each peak memory (max RSS) is its own.
import { spawnSync } from 'node:child_process';
import { createWriteStream, existsSync, mkdirSync, renameSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { once } from 'node:events';
import { projectRoot } from '../server/project-root';
import { csvChunks, DEMO_HATCH, simulateSamples } from '../shared/sim';

const PYTHON = '/usr/bin/python3';
const SIZES = (process.env['BENCH_INGEST_ROWS'] ?? '100000,1000000,4000000').split(',').map(Number);
const RATE_HZ = 50;
const cache = join(projectRoot(), 'bench', '.cache');

function ensurePeer(): void {
  const check = () =>
    spawnSync(PYTHON, ['-c', 'import pandas, scipy'], { stdio: 'ignore' }).status === 0;
  if (check()) return;
  if (process.getuid?.() !== 0) {
    throw new Error(
      'the peer needs Debian packages python3-pandas and python3-scipy: install them as root',
    );
  }
  console.log('installing python3-pandas and python3-scipy…');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  spawnSync('apt-get', ['update', '-q'], { stdio: 'inherit', env });
  const r = spawnSync('apt-get', ['install', '-y', '-q', 'python3-pandas', 'python3-scipy'], {
    stdio: 'inherit',
    env,
  });
  if (r.status !== 0 || !check())
    throw new Error('could not install python3-pandas and python3-scipy');
}

async function ensureCsv(rows: number): Promise<string> {
  const file = join(cache, `ingest-${rows}.csv`);
  if (existsSync(file)) return file;
  console.log(`generating ${rows} rows with the simulator…`);
  const samples = simulateSamples({
    vehicle: DEMO_HATCH,
    kind: 'road',
    seed: 42,
    sampleRateHz: RATE_HZ,
    durationS: (rows - 0.5) / RATE_HZ,
    startEctC: 85,
  });
  const tmp = `${file}.tmp`;
  const out = createWriteStream(tmp);
  for (const chunk of csvChunks(samples, 'snake', { rowsPerChunk: 8192 })) {
    if (!out.write(chunk)) await once(out, 'drain');
  }
  out.end();
  await once(out, 'finish');
  renameSync(tmp, file);
  return file;
}

function runJson(command: string, args: string[]): Record<string, number> {
  const r = spawnSync(command, args, { encoding: 'utf8', cwd: projectRoot(), maxBuffer: 1 << 20 });
  if (r.status !== 0) throw new Error(`${command} ${args.join(' ')} failed:\n${r.stderr}`);
  const line = r.stdout.trim().split('\n').pop() ?? '{}';
  return JSON.parse(line) as Record<string, number>;
}

async function main(): Promise<void> {
  ensurePeer();
  mkdirSync(cache, { recursive: true });
  const axesFile = join(cache, 'axes.json');
  writeFileSync(axesFile, JSON.stringify(DEMO_HATCH.axes));
  let last = '';
  for (const rows of SIZES) {
    const csv = await ensureCsv(rows);
    const ours = runJson('node', [
      '--import',
      'tsx',
      'bench/ingest-run.ts',
      csv,
      axesFile,
      String(DEMO_HATCH.engine.displacementL),
    ]);
    const peer = runJson(PYTHON, ['bench/peer/ingest_peer.py', csv, axesFile]);
    const f = (n: number | undefined, d = 2) => (n ?? NaN).toFixed(d);
    console.log(
      `${rows} rows: cellsmith ${f(ours['seconds'])} s (parse ${f(ours['parseS'])}, align+filter ${f(ours['alignFilterS'])}, accumulate ${f(ours['accumulateS'])}), ` +
        `kept ${ours['kept']}, peak ${f(ours['peakMiB'], 0)} MiB | peer ${f(peer['seconds'])} s, kept ${peer['kept']}, peak ${f(peer['peakMiB'], 0)} MiB`,
    );
    if (rows === 1_000_000 || !last) {
      last =
        `ingest: cellsmith ${f(ours['seconds'])} s, peer ${f(peer['seconds'])} s, ratio ${f((ours['seconds'] ?? 0) / (peer['seconds'] ?? 1))}; ` +
        `peak ${f(ours['peakMiB'], 0)} MiB vs ${f(peer['peakMiB'], 0)} MiB`;
    }
  }
  console.log(last);
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
