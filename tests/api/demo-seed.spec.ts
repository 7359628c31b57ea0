import { seedDemoGarage } from '../../server/seed/demo-garage';
import { demoPassword } from '../../server/seed/demo-shop';
import type { LogResource } from '../../shared/contracts/logs';
import type { Vehicle } from '../../shared/contracts/vehicles';
import { signedIn } from './support/api-client';
import { startTestApp, type TestApp } from './support/test-app';

// `npm test` seeds the demo shops before the tests, as `npm start` does.
describe('the demo shop', () => {
  let t: TestApp;

  beforeAll(async () => {
    t = await startTestApp();
  });
  afterAll(() => t.close());

  it('When a demo tuner signs in, then vehicles with parsed logs are there', async () => {
    const tuner = await signedIn(t.app, 'tuner@cellsmith.test', demoPassword());
    const list = await tuner.get('/api/vehicles');
    expect(list.status).toBe(200);
    const labels = (list.body.items as Vehicle[]).map((v) => v.label);
    expect(labels).toEqual(expect.arrayContaining(['Demo hatch 1.6T', 'Demo roadster 2.0']));
    const hatch = (list.body.items as Vehicle[]).find((v) => v.label === 'Demo hatch 1.6T');
    const logs = await tuner.get(`/api/vehicles/${hatch?.id}/logs`);
    // The browser tests may upload to the same demo vehicle meanwhile: look at the seeded files.
    const seeded = (logs.body.items as LogResource[]).filter((log) =>
      log.fileName.startsWith('demo-hatch-1-6t-'),
    );
    expect(seeded).toHaveLength(2);
    for (const log of seeded) {
      expect(log.status).toBe('ready');
      expect(log.sampleCount).toBeGreaterThan(1000);
    }
  });

  it('When the other shop looks, then it sees only its own vehicle', async () => {
    const other = await signedIn(t.app, 'tuner@other.test', demoPassword());
    const list = await other.get('/api/vehicles');
    expect((list.body.items as Vehicle[]).map((v) => v.label)).toEqual(['Demo roadster 2.0']);
  });

  it('When the seed runs again, then it adds nothing', async () => {
    expect(await seedDemoGarage(t.db, t.config)).toBe(0);
  });
});
