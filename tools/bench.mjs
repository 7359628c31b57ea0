// `npm run bench -- <name>`: runs bench/<name>.ts (all of them without a name).
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { ROOT, ensureNodeModules, run, say } from './setup.mjs';

ensureNodeModules();
const available = readdirSync(join(ROOT, 'bench'))
  .filter((name) => name.endsWith('.ts'))
  .map((name) => name.slice(0, -3));
const wanted = process.argv.slice(2);
const unknown = wanted.filter((name) => !available.includes(name));
if (unknown.length) {
  console.error(`unknown benchmark ${unknown.join(', ')}; available: ${available.join(', ')}`);
  process.exit(2);
}
for (const name of wanted.length ? wanted : available) {
  say(`benchmark ${name}`);
  run('node', ['--import', 'tsx', join('bench', `${name}.ts`)]);
}
