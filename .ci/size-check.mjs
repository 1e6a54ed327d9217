// Deterministic check of the shipped JavaScript: the app shell's gzipped size against the budget of
// DESIGN.md (≤ 60 KB gzipped). Run after `vite build`. Prints the figure; exits 1 over budget.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';

export const SHELL_BUDGET_BYTES = 60 * 1024;

export function shellGzipBytes(dist = 'dist') {
  const assets = join(dist, 'assets');
  let total = 0;
  const files = [];
  for (const name of readdirSync(assets)) {
    if (!name.endsWith('.js')) continue;
    const path = join(assets, name);
    if (!statSync(path).isFile()) continue;
    const gz = gzipSync(readFileSync(path), { level: 9 }).length;
    files.push({ name, gz });
    total += gz;
  }
  return { total, files };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const { total, files } = shellGzipBytes();
  for (const f of files) console.log(`  ${f.name}: ${(f.gz / 1024).toFixed(1)} KB gzipped`);
  const ok = total <= SHELL_BUDGET_BYTES;
  console.log(
    `app shell JavaScript: ${(total / 1024).toFixed(1)} KB gzipped (budget ${SHELL_BUDGET_BYTES / 1024} KB) ${ok ? 'ok' : 'OVER BUDGET'}`,
  );
  process.exit(ok ? 0 : 1);
}
