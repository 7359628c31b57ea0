// Benchmark: what the API's middleware stack (helmet CSP with a fresh nonce, cookies, sessions,
// passport, CSRF cookie, zod, JSON) costs per request. Cellsmith's `GET /api/meta` is measured
// against a peer measured in the same run: a bare node:http server answering the same JSON.
// A bare Express 5 app is measured too, to show what our own middleware adds.
// No database is touched (the session store is only read for requests that carry a cookie).
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import autocannon from 'autocannon';
import express from 'express';
import { Pool } from 'pg';
import { drizzle } from 'drizzle-orm/node-postgres';
import * as schema from '../db/schema';
import { createApp } from '../server/app';
import { loadConfig } from '../server/config';
import type { Mailer } from '../server/mail/mailer';

const DURATION_S = Number(process.env['BENCH_SECONDS'] ?? 5);
const CONNECTIONS = 10;

function listen(server: Server): Promise<string> {
  return new Promise((resolveUrl) =>
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as AddressInfo;
      resolveUrl(`http://127.0.0.1:${port}`);
    }),
  );
}

async function measure(label: string, url: string): Promise<number> {
  // The load runs in a worker thread so it does not share the servers' event loop.
  const result = await autocannon({
    url,
    connections: CONNECTIONS,
    duration: DURATION_S,
    workers: 1,
  });
  const rps = result.requests.average;
  console.log(
    `${label.padEnd(10)} ${rps.toFixed(0).padStart(7)} req/s  p50 ${result.latency.p50} ms  p99 ${result.latency.p99} ms  errors ${result.errors + result.non2xx}`,
  );
  return rps;
}

async function main(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'cellsmith-bench-'));
  const config = loadConfig({
    NODE_ENV: 'test',
    CELLSMITH_DATA_DIR: dir,
    DATABASE_URL: 'postgres://postgres@127.0.0.1:1/unused',
  });
  const pool = new Pool({ connectionString: config.databaseUrl });
  const mailer: Mailer = { send: () => Promise.resolve(), close: () => undefined };
  const built = createApp(
    {
      config,
      db: drizzle(pool, { schema }),
      mailer,
      capturedMailDir: null,
      // No uploads are measured: nothing is ever queued.
      logJobs: { enqueueParse: () => Promise.resolve() },
    },
    { pool, serveClient: false },
  );
  const body = JSON.stringify({ mailCapture: false, version: '0.1.0' });
  const peer = createServer((_req, res) => {
    res.writeHead(200, { 'Content-Type': 'application/json; charset=utf-8' });
    res.end(body);
  });
  const bareExpress = express();
  bareExpress.get('/api/meta', (_req, res) => {
    res.json({ mailCapture: false, version: '0.1.0' });
  });
  const expressServer = createServer(bareExpress);
  const cellsmith = createServer(built.app);
  const [peerUrl, expressUrl, ourUrl] = await Promise.all([
    listen(peer),
    listen(expressServer),
    listen(cellsmith),
  ]);

  console.log(
    `GET /api/meta, ${CONNECTIONS} connections, ${DURATION_S} s each, same machine, same run`,
  );
  const peerRps = await measure('peer', `${peerUrl}/api/meta`);
  const expressRps = await measure('express', `${expressUrl}/api/meta`);
  const ourRps = await measure('cellsmith', `${ourUrl}/api/meta`);
  console.log(
    `our middleware keeps ${((100 * ourRps) / expressRps).toFixed(0)} % of bare Express's rate`,
  );
  console.log(
    `http-stack: cellsmith ${ourRps.toFixed(0)} req/s, peer ${peerRps.toFixed(0)} req/s, ratio ${(ourRps / peerRps).toFixed(2)}`,
  );

  cellsmith.close();
  expressServer.close();
  peer.close();
  built.close();
  await pool.end();
  rmSync(dir, { recursive: true, force: true });
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
