// Deterministic check of the shipped JavaScript against its budget (DEVELOPERS.md, "Budgets"): the app
// shell ≤ 60 KB gzipped.
// The app shell is the JavaScript the page needs before its first paint: the entry script(s) of
// dist/index.html and every chunk they import statically. Chunks loaded with import() after the first
// paint (the statistics core, the hand-over exports) are reported beside it, not hidden.
// Run after `vite build`; exits 1 when the shell is over budget.
import { readdirSync, readFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { gzipSync } from 'node:zlib';

export const SHELL_BUDGET_BYTES = 60 * 1024;

const gz = (path) => gzipSync(readFileSync(path), { level: 9 }).length;

/** Static imports of an ES chunk: `import "./x.js"`, `from "./x.js"` (not `import("./x.js")`). */
function staticImports(code) {
  const out = new Set();
  for (const m of code.matchAll(/(?:^|[;\s}])(?:import|from)\s*["'`]\.\/([^"'`]+\.js)["'`]/g)) out.add(m[1]);
  return out;
}

export function shellGzipBytes(dist = 'dist') {
  const assets = join(dist, 'assets');
  const html = readFileSync(join(dist, 'index.html'), 'utf8');
  const entries = [...html.matchAll(/<script[^>]*type="module"[^>]*src="\/assets\/([^"]+\.js)"/g)].map(
    (m) => m[1],
  );
  const preloads = [...html.matchAll(/<link[^>]*rel="modulepreload"[^>]*href="\/assets\/([^"]+\.js)"/g)].map(
    (m) => m[1],
  );
  const shell = new Set();
  const queue = [...entries, ...preloads];
  while (queue.length > 0) {
    const name = queue.pop();
    if (shell.has(name)) continue;
    shell.add(name);
    for (const dep of staticImports(readFileSync(join(assets, name), 'utf8'))) queue.push(basename(dep));
  }
  const files = readdirSync(assets)
    .filter((n) => n.endsWith('.js'))
    .map((name) => ({ name, gz: gz(join(assets, name)), shell: shell.has(name) }));
  const total = files.filter((f) => f.shell).reduce((s, f) => s + f.gz, 0);
  const all = files.reduce((s, f) => s + f.gz, 0);
  return { total, all, files };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const { total, all, files } = shellGzipBytes(process.argv[2] ?? 'dist');
  for (const f of files)
    console.log(
      `  ${f.name}: ${(f.gz / 1024).toFixed(1)} KB gzipped${f.shell ? ' (shell)' : ' (loaded after first paint)'}`,
    );
  const ok = total <= SHELL_BUDGET_BYTES;
  console.log(
    `app shell JavaScript: ${(total / 1024).toFixed(1)} KB gzipped (budget ${SHELL_BUDGET_BYTES / 1024} KB) ${ok ? 'ok' : 'OVER BUDGET'}; all JavaScript ${(all / 1024).toFixed(1)} KB`,
  );
  process.exit(ok ? 0 : 1);
}
