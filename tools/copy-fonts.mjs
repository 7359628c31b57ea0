// Copies the self-hosted fonts (and their licences) from node_modules into fonts/.
// The copies are committed so a build never depends on a CDN; run `npm run fonts:copy` after
// bumping @fontsource/roboto or material-symbols, then review and commit the diff.
import { copyFileSync, existsSync, mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const modules = join(root, 'node_modules');
const fonts = join(root, 'fonts');

/** Each entry: [source under node_modules, target under fonts/]. */
const copies = [
  [
    '@fontsource/roboto/files/roboto-latin-400-normal.woff2',
    'roboto/roboto-latin-400-normal.woff2',
  ],
  [
    '@fontsource/roboto/files/roboto-latin-500-normal.woff2',
    'roboto/roboto-latin-500-normal.woff2',
  ],
  [
    '@fontsource/roboto/files/roboto-latin-700-normal.woff2',
    'roboto/roboto-latin-700-normal.woff2',
  ],
  ['@fontsource/roboto/LICENSE', 'roboto/LICENSE'],
  // The package ships only variable fonts (no static cut); outlined is the one the UI uses.
  [
    'material-symbols/material-symbols-outlined.woff2',
    'material-symbols/material-symbols-outlined.woff2',
  ],
  ['material-symbols/LICENSE', 'material-symbols/LICENSE'],
];

let missing = 0;
for (const [from, to] of copies) {
  const source = join(modules, from);
  if (!existsSync(source)) {
    console.error(`copy-fonts: ${from} is missing; run npm install first`);
    missing += 1;
    continue;
  }
  const target = join(fonts, to);
  mkdirSync(dirname(target), { recursive: true });
  copyFileSync(source, target);
  console.log(`copy-fonts: ${from} -> fonts/${to}`);
}
process.exitCode = missing === 0 ? 0 : 1;
