// `npm test`: the set-up of `npm start` on a throwaway cluster and database (free port, temp
// folder, removed afterwards), then type-checks, lint, format check and every Jest project,
// closing with one line `N passed, N failed`. Extra arguments go to Jest. Set
// CELLSMITH_TEST_SKIP=typecheck,lint,cycles,format,build to skip steps while iterating.
import { spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensureClientBuild } from './client-build.mjs';
import {
  databaseUrl,
  ensureDatabase,
  ensurePostgres,
  initCluster,
  startCluster,
  stopCluster,
} from './pg.mjs';
import { IS_ROOT, ROOT, ensureDebianPackage, ensureNodeModules, run, say } from './setup.mjs';

const CHROMIUM = '/usr/bin/chromium';
const skip = new Set((process.env.CELLSMITH_TEST_SKIP || '').split(',').filter(Boolean));
const jestArgs = process.argv.slice(2);

function freePort() {
  return new Promise((resolvePort, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const { port } = probe.address();
      probe.close(() => resolvePort(port));
    });
  });
}

const steps = { passed: 0, failed: 0, names: [] };

function step(name, command, args, env) {
  if (skip.has(name.split(':')[0])) return;
  say(`${name}…`);
  const result = spawnSync(command, args, { cwd: ROOT, stdio: 'inherit', env });
  const ok = result.status === 0;
  steps[ok ? 'passed' : 'failed']++;
  steps.names.push(`${ok ? 'ok  ' : 'FAIL'} ${name}`);
}

async function main() {
  ensureNodeModules();
  const bin = ensurePostgres();
  ensureDebianPackage('chromium', () => existsSync(CHROMIUM), 'the browser tests');

  const tmp = mkdtempSync(join(tmpdir(), 'cellsmith-test-'));
  if (IS_ROOT) chmodSync(tmp, 0o755);
  const clusterDir = join(tmp, 'pg');
  const dataDir = join(tmp, 'data');
  mkdirSync(dataDir);
  const pgPort = await freePort();
  let clusterStarted = false;
  let exitCode = 1;
  const cleanup = () => {
    if (clusterStarted) stopCluster(bin, clusterDir);
    clusterStarted = false;
    rmSync(tmp, { recursive: true, force: true });
  };
  process.on('SIGINT', () => {
    cleanup();
    process.exit(130);
  });
  try {
    initCluster(bin, clusterDir);
    say(`starting a throwaway PostgreSQL on 127.0.0.1:${pgPort}…`);
    startCluster(bin, clusterDir, pgPort, [
      'fsync=off',
      'synchronous_commit=off',
      'full_page_writes=off',
    ]);
    clusterStarted = true;
    ensureDatabase(bin, pgPort, 'cellsmith_test');
    const env = {
      ...process.env,
      NODE_ENV: 'test',
      PGPORT: String(pgPort),
      CELLSMITH_DATA_DIR: dataDir,
      DATABASE_URL: databaseUrl(pgPort, 'cellsmith_test'),
      CHROMIUM_PATH: CHROMIUM,
      SESSION_SECRET: 'test-secret-that-is-long-enough-to-pass-validation',
    };
    run('node', ['--import', 'tsx', 'server/setup-cli.ts'], { env });
    if (!skip.has('build')) ensureClientBuild();

    step('typecheck:app', 'npx', ['tsc', '--noEmit', '-p', 'tsconfig.app.json'], env);
    step('typecheck:spec', 'npx', ['tsc', '--noEmit', '-p', 'tsconfig.spec.json'], env);
    step('typecheck:server', 'npx', ['tsc', '--noEmit', '-p', 'tsconfig.server.json'], env);
    step('lint', 'npx', ['eslint', '.'], env);
    step('cycles', 'node', ['tools/check-import-cycles.mjs'], env);
    step('format', 'npx', ['prettier', '--check', '.', '--log-level', 'warn'], env);

    const report = join(tmp, 'jest.json');
    say('jest (shared, server, web, e2e)…');
    // --forceExit: a handle a test forgot (a browser left open) must not hang CI; Jest still
    // names the problem in its output, and the run's result is unchanged.
    spawnSync('npx', ['jest', '--json', '--forceExit', `--outputFile=${report}`, ...jestArgs], {
      cwd: ROOT,
      stdio: 'inherit',
      env,
    });
    let passed = steps.passed;
    let failed = steps.failed;
    if (existsSync(report)) {
      const jest = JSON.parse(readFileSync(report, 'utf8'));
      passed += jest.numPassedTests;
      failed += jest.numFailedTests + jest.numRuntimeErrorTestSuites;
      if (jest.numTotalTests === 0) failed += 1;
    } else {
      say('jest wrote no report');
      failed += 1;
    }
    for (const line of steps.names) say(line);
    console.log(`${passed} passed, ${failed} failed`);
    exitCode = failed === 0 ? 0 : 1;
  } finally {
    cleanup();
  }
  process.exit(exitCode);
}

main().catch((err) => {
  console.error(`[cellsmith] ${err instanceof Error ? err.stack : err}`);
  console.log('0 passed, 1 failed');
  process.exit(1);
});
