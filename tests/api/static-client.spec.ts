import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { createApp } from '../../server/app';
import { loadConfig } from '../../server/config';
import { openDatabase, type DatabaseHandle } from '../../server/db';

describe('serving the built client', () => {
  let dist: string;
  let handle: DatabaseHandle;
  let built: ReturnType<typeof createApp>;

  beforeAll(() => {
    dist = mkdtempSync(join(tmpdir(), 'cellsmith-dist-'));
    mkdirSync(join(dist, 'media'));
    writeFileSync(
      join(dist, 'index.html'),
      '<html><head><script src="main-ABCDEFGH.js" type="module" nonce="CSP_NONCE"></script></head>' +
        '<body><app-root ngCspNonce="CSP_NONCE"></app-root></body></html>',
    );
    writeFileSync(join(dist, 'main-ABCDEFGH.js'), 'console.log(1);');
    const config = loadConfig({
      NODE_ENV: 'test',
      DATABASE_URL: process.env['DATABASE_URL'] ?? 'postgres://postgres@127.0.0.1:1/none',
      CELLSMITH_DATA_DIR: dist,
      CLIENT_DIST: dist,
    });
    handle = openDatabase(config.databaseUrl, 1);
    built = createApp(
      {
        config,
        db: handle.db,
        mailer: { send: () => Promise.resolve(), close: () => undefined },
        capturedMailDir: null,
        logJobs: { enqueueParse: () => Promise.resolve() },
      },
      { pool: handle.pool },
    );
  });
  afterAll(async () => {
    built.close();
    await handle.pool.end();
    rmSync(dist, { recursive: true, force: true });
  });

  it('When a deep link is opened, then index.html comes back with the CSP nonce of that response', async () => {
    const res = await request(built.app).get('/team');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/html/);
    const nonce = /'nonce-([^']+)'/.exec(res.headers['content-security-policy'] as string)?.[1];
    expect(nonce).toBeTruthy();
    expect(res.text).not.toContain('CSP_NONCE');
    expect(res.text).toContain(`ngCspNonce="${nonce}"`);
    expect(res.text).toContain(`nonce="${nonce}"`);
    expect(res.headers['cache-control']).toBe('no-store');
  });

  it('When a hashed asset is fetched, then it is cached for a long time', async () => {
    const res = await request(built.app).get('/main-ABCDEFGH.js');
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toContain('immutable');
  });

  it('When an unknown API path is fetched, then it is a JSON 404, not the index page', async () => {
    const res = await request(built.app).get('/api/nothing-here');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });
});
