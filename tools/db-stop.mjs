// `npm run db:stop`: stops a project cluster left running in CELLSMITH_DATA_DIR.
import { join, resolve } from 'node:path';
import { findPgBin, stopCluster } from './pg.mjs';
import { ROOT, say } from './setup.mjs';

const clusterDir = join(resolve(ROOT, process.env.CELLSMITH_DATA_DIR || '.data'), 'pg');
const bin = findPgBin();
if (!bin) {
  say('PostgreSQL is not installed; nothing to stop');
} else if (stopCluster(bin, clusterDir)) {
  say(`stopped PostgreSQL in ${clusterDir}`);
} else {
  say(`no PostgreSQL is running in ${clusterDir}`);
}
