// `npm run lint:layers`: checks the layering rules of .dependency-cruiser.cjs with
// dependency-cruiser. dependency-cruiser reads TypeScript through the TypeScript compiler's
// JavaScript API, which the native TypeScript 7 compiler does not have, so this script first
// writes a JavaScript copy of src/, server/ and shared/ with esbuild (type-only imports kept as
// plain imports, so they count too; the @/ and @shared/ aliases made relative), runs the rules on
// the copy, and reports in the sources' own file names. Exit code 1 when a rule is broken.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import { transform } from 'esbuild';
import { cruise } from 'dependency-cruiser';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const require = createRequire(import.meta.url);
const config = require(path.join(root, '.dependency-cruiser.cjs'));
const DIRS = ['src', 'server', 'shared'];
const ALIASES = [['@/', 'src/'], ['@shared/', 'shared/']];

function* sources(dir) {
  for (const entry of fs.readdirSync(path.join(root, dir), { withFileTypes: true })) {
    const rel = path.posix.join(dir, entry.name);
    if (entry.isDirectory()) yield* sources(rel);
    else if (/\.(ts|tsx|mjs|js)$/.test(entry.name) && !entry.name.endsWith('.d.ts')) yield rel;
  }
}

/** A specifier as it reads from `file` in the copy: aliases made relative, .ts/.tsx → .js. */
function rewriteSpecifier(file, specifier) {
  let target = specifier;
  for (const [alias, dir] of ALIASES) {
    if (target.startsWith(alias)) {
      const relative = path.posix.relative(path.posix.dirname(file), dir + target.slice(alias.length));
      target = relative.startsWith('.') ? relative : `./${relative}`;
    }
  }
  return target.startsWith('.') ? target.replace(/\.(ts|tsx)$/, '.js') : target;
}

function prepare(file, text) {
  return (
    text
      // type-only imports and re-exports still tie one module to another: keep the edge, drop the names
      .replace(/^(\s*)(?:import|export)\s+type\s+(?:\*|[\w$]+|\{[^}]*\})\s+from\s+(['"][^'"]+['"])/gm, '$1import $2')
      .replace(/^(\s*)export\s+type\s+\*\s+as\s+[\w$]+\s+from\s+(['"][^'"]+['"])/gm, '$1import $2')
      .replace(/(\bfrom\s+|\bimport\s*\(\s*|^\s*import\s+)(['"])([^'"]+)\2/gm, (_m, head, quote, specifier) => `${head}${quote}${rewriteSpecifier(file, specifier)}${quote}`)
  );
}

const copy = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-layers-'));
const names = new Map();
try {
  fs.symlinkSync(path.join(root, 'node_modules'), path.join(copy, 'node_modules'), 'dir');
  for (const dir of DIRS) {
    for (const file of sources(dir)) {
      const out = file.replace(/\.(ts|tsx|mjs)$/, '.js');
      if (names.has(out)) throw new Error(`${file} and ${names.get(out)} would share ${out} in the copy; rename one`);
      names.set(out, file);
      const text = prepare(file, fs.readFileSync(path.join(root, file), 'utf8'));
      const loader = file.endsWith('.tsx') ? 'tsx' : file.endsWith('.ts') ? 'ts' : 'js';
      const { code } = await transform(text, { loader, format: 'esm', jsx: 'automatic', sourcefile: file, tsconfigRaw: { compilerOptions: { verbatimModuleSyntax: true } } });
      fs.mkdirSync(path.dirname(path.join(copy, out)), { recursive: true });
      fs.writeFileSync(path.join(copy, out), code);
    }
  }
  const cwd = process.cwd();
  process.chdir(copy);
  let result;
  try {
    result = await cruise(DIRS, { ruleSet: { forbidden: config.forbidden }, ...config.options, preserveSymlinks: true, validate: true, outputType: 'err-long' });
  } finally {
    process.chdir(cwd);
  }
  // the report in the sources' own names
  let text = String(result.output);
  for (const [out, file] of [...names].sort((a, b) => b[0].length - a[0].length)) text = text.split(out).join(file);
  process.stdout.write(`layers, ${config.forbidden.length} rules of .dependency-cruiser.cjs:\n${text.trim()}\n`);
  process.exitCode = result.exitCode === 0 ? 0 : 1;
} finally {
  fs.rmSync(copy, { recursive: true, force: true });
}
