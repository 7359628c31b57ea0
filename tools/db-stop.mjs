// `npm run db:stop`: stops a project cluster left running for CELLSMITH_DATA_DIR, wherever
// `npm start` put it (see `clusterDirFor`).
import { join, resolve } from 'node:path';
import { clusterDirFor, findPgBin, stopCluster, systemClusterDir } from './pg.mjs';
import { IS_ROOT, ROOT, say } from './setup.mjs';

const dataDir = resolve(ROOT, process.env.CELLSMITH_DATA_DIR || '.data');
const bin = findPgBin();
if (!bin) {
  say('PostgreSQL is not installed; nothing to stop');
} else {
  // The folder's permissions may have changed since the start: look in both places.
  const candidates = new Set([clusterDirFor(dataDir), join(dataDir, 'pg')]);
  if (IS_ROOT) candidates.add(systemClusterDir(dataDir));
  let stopped = 0;
  for (const clusterDir of candidates) {
    if (stopCluster(bin, clusterDir)) {
      say(`stopped PostgreSQL in ${clusterDir}`);
      stopped++;
    }
  }
  if (stopped === 0) say(`no PostgreSQL is running for ${dataDir}`);
}
