// `npm test` runs this: fails when TypeScript modules import each other in a loop — type-only
// imports included, since a reader still has to hold both ends of a loop in mind. ESLint's cycle
// rules skip type imports, hence this check. Uses the TypeScript compiler's own import scanner.
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import ts from 'typescript';
import { ROOT } from './setup.mjs';

/** Folders whose modules are checked (tests may reach into them; they are leaves). */
const FOLDERS = ['shared', 'server', 'db', 'src'];
/** Path aliases of tsconfig.json. */
const ALIASES = { '@shared/': 'shared/', '@db/': 'db/' };

function sourceFiles(dir) {
  const out = [];
  for (const name of readdirSync(dir)) {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) out.push(...sourceFiles(path));
    else if (/\.ts$/.test(name) && !/\.(spec|e2e)\.ts$/.test(name)) out.push(path);
  }
  return out;
}

/** The file an import names, or null for a package. */
function resolveImport(from, spec) {
  let base = null;
  if (spec.startsWith('.')) base = resolve(dirname(from), spec);
  for (const [alias, folder] of Object.entries(ALIASES)) {
    if (spec.startsWith(alias)) base = join(ROOT, folder, spec.slice(alias.length));
  }
  if (base === null) return null;
  for (const candidate of [`${base}.ts`, join(base, 'index.ts'), base]) {
    if (existsSync(candidate) && statSync(candidate).isFile()) return candidate;
  }
  return null;
}

/** The loops of the import graph: strongly connected components of more than one module. */
export function findImportCycles() {
  const files = FOLDERS.filter((f) => existsSync(join(ROOT, f))).flatMap((f) =>
    sourceFiles(join(ROOT, f)),
  );
  const edges = new Map();
  for (const file of files) {
    const info = ts.preProcessFile(readFileSync(file, 'utf8'), true, true);
    const targets = info.importedFiles
      .map((ref) => resolveImport(file, ref.fileName))
      .filter((target) => target !== null && target !== file);
    edges.set(file, [...new Set(targets)]);
  }
  // Tarjan's strongly connected components, iteratively (deep graphs would blow the stack).
  let counter = 0;
  const index = new Map();
  const low = new Map();
  const onStack = new Set();
  const stack = [];
  const cycles = [];
  for (const start of files) {
    if (index.has(start)) continue;
    const work = [[start, 0]];
    while (work.length > 0) {
      const frame = work[work.length - 1];
      const [node, next] = frame;
      if (next === 0) {
        index.set(node, counter);
        low.set(node, counter++);
        stack.push(node);
        onStack.add(node);
      }
      const targets = edges.get(node) ?? [];
      if (next < targets.length) {
        frame[1]++;
        const target = targets[next];
        if (!index.has(target)) work.push([target, 0]);
        else if (onStack.has(target)) low.set(node, Math.min(low.get(node), index.get(target)));
        continue;
      }
      work.pop();
      if (work.length > 0) {
        const parent = work[work.length - 1][0];
        low.set(parent, Math.min(low.get(parent), low.get(node)));
      }
      if (low.get(node) === index.get(node)) {
        const component = [];
        let member;
        do {
          member = stack.pop();
          onStack.delete(member);
          component.push(relative(ROOT, member));
        } while (member !== node);
        if (component.length > 1) cycles.push(component.sort());
      }
    }
  }
  return cycles;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const cycles = findImportCycles();
  for (const cycle of cycles) console.error(`import loop: ${cycle.join(' ⇄ ')}`);
  if (cycles.length > 0) {
    console.error(
      `${cycles.length} import loop(s): move the shared types to the module that owns them`,
    );
    process.exit(1);
  }
  console.log('[cellsmith] no import loops');
}
