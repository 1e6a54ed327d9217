// The linter enforces the written import order of src/ (DEVELOPERS.md, "Import order") and the one jstat
// importer. The outside reference is the order as written in DEVELOPERS.md (read from the file, not
// copied here) and Biome's own diagnostics: each fixture is a two-line file placed, in a scratch copy of
// the repository's layout that carries the real .biome.json, where the import would be a back-import,
// a stray jstat import, or a clean import. Biome must fail naming lint/style/noRestrictedImports on every
// bad one and stay silent on every clean one. The scratch copy keeps the fixtures out of the real src/,
// where other tools (tsc, Vitest, the app build) would trip over them.
import { spawnSync } from 'node:child_process';
import {
  copyFileSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  readFileSync,
  rmSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = resolve(import.meta.dirname, '../..');
const biome = join(root, 'node_modules/.bin/biome');
const RULE = 'lint/style/noRestrictedImports';

/** The order as DEVELOPERS.md writes it: `model ← stats ← … ← cli` on one line. */
function writtenOrder(): string[] {
  const text = readFileSync(join(root, 'DEVELOPERS.md'), 'utf8');
  const line = text.split('\n').find((l) => /^\s*model ← stats ←/.test(l));
  if (line === undefined) throw new Error('DEVELOPERS.md has no "model ← stats ← …" line');
  return line.trim().split(/\s*←\s*/);
}

interface Diagnostic {
  category: string;
  message: string;
  location: { path: string };
}

function lint(dir: string, paths: string[]): { status: number | null; diagnostics: Diagnostic[] } {
  const run = spawnSync(biome, ['lint', '--reporter=json', '--max-diagnostics=none', ...paths], {
    cwd: dir,
    encoding: 'utf8',
  });
  const json = run.stdout.slice(run.stdout.indexOf('{'));
  const report = JSON.parse(json) as { diagnostics: Diagnostic[] };
  return { status: run.status, diagnostics: report.diagnostics };
}

interface Fixture {
  path: string;
  source: string;
  bad: boolean;
}

const order = writtenOrder();
const fixtures: Fixture[] = [];
const importer = (spec: string) => `import { x } from '${spec}';\nexport const y = x;\n`;

// Every ordered pair of folders: a file in src/<from> importing src/<to>. Allowed only when <to> is to
// the left of <from> in the written order (or is <from> itself).
for (const [i, from] of order.entries()) {
  for (const [j, to] of order.entries()) {
    if (i === j) continue;
    fixtures.push({
      path: `src/${from}/imports-${to}.ts`,
      source: importer(`../${to}/x.ts`),
      bad: j > i,
    });
  }
}
// Deeper files count too: a subfolder of src/model importing src/stats two levels up.
fixtures.push({
  path: 'src/model/deep/imports-stats.ts',
  source: importer('../../stats/x.ts'),
  bad: true,
});
// jstat: the facade (and its declaration file) may import it; nothing else in src, web or test may.
fixtures.push({ path: 'src/stats/distributions.ts', source: importer('jstat'), bad: false });
for (const p of [
  'src/stats/stray.ts',
  'src/plan/stray.ts',
  'src/cli/stray.ts',
  'web/stray.ts',
  'test/stray.ts',
])
  fixtures.push({ path: p, source: importer('jstat'), bad: true });
// The bans that predate the order: src never imports web, UI or storage libraries; the barrel
// src/index.ts never imports the Node command line.
fixtures.push({ path: 'src/stats/imports-web.ts', source: importer('../../web/app/x.tsx'), bad: true });
fixtures.push({ path: 'src/design/imports-preact.ts', source: importer('preact/hooks'), bad: true });
fixtures.push({ path: 'src/plan/imports-idb.ts', source: importer('idb'), bad: true });
fixtures.push({ path: 'src/stop/imports-test.ts', source: importer('../../test/sim/x.ts'), bad: true });
fixtures.push({ path: 'src/index.ts', source: importer('./cli/main.ts'), bad: true });
fixtures.push({ path: 'web/imports-src.ts', source: importer('../src/index.ts'), bad: false });

let scratch = '';

beforeAll(() => {
  scratch = mkdtempSync(join(tmpdir(), 'sure-enough-lint-'));
  copyFileSync(join(root, '.biome.json'), join(scratch, '.biome.json'));
  for (const f of fixtures) {
    mkdirSync(dirname(join(scratch, f.path)), { recursive: true });
    writeFileSync(join(scratch, f.path), f.source);
  }
});

afterAll(() => {
  if (scratch !== '') rmSync(scratch, { recursive: true, force: true });
});

describe('import order written in DEVELOPERS.md, enforced by Biome', () => {
  it('the written order lists every folder of src/ once, from model to the Node edges cli and server', () => {
    const folders = readdirSync(join(root, 'src'), { withFileTypes: true })
      .filter((d) => d.isDirectory())
      .map((d) => d.name);
    expect(order[0]).toBe('model');
    expect(order.slice(-2)).toEqual(['cli', 'server']);
    expect(new Set(order).size).toBe(order.length);
    // a folder may be written before it exists (server is added by its own change), never left out
    expect(folders.filter((f) => !order.includes(f))).toEqual([]);
  });

  it('every back-import and every stray jstat import fails naming the rule; every clean import passes', () => {
    const { status, diagnostics } = lint(
      scratch,
      fixtures.map((f) => f.path),
    );
    expect(status).not.toBe(0);
    const flagged = new Map<string, Diagnostic>();
    for (const d of diagnostics) if (d.category === RULE) flagged.set(d.location.path, d);
    const wrong = fixtures
      .filter((f) => flagged.has(f.path) !== f.bad)
      .map((f) => `${f.path} (${f.bad ? 'not refused' : 'refused'})`);
    expect(wrong).toEqual([]);
    // The message points at the order, so whoever hits it knows where to look.
    expect(flagged.get('src/stats/imports-assess.ts')?.message).toMatch(
      /src\/stats may import only src\/model/,
    );
    expect(flagged.get('src/plan/stray.ts')?.message).toMatch(/distributions\.ts/);
  });

  it('a run over clean imports only exits 0', () => {
    const clean = fixtures.filter((f) => !f.bad).map((f) => f.path);
    const { status, diagnostics } = lint(scratch, clean);
    expect(diagnostics.filter((d) => d.category === RULE)).toEqual([]);
    expect(status).toBe(0);
  });
});

describe('the repository itself', () => {
  it('has no back-import and no stray jstat import', () => {
    const { diagnostics } = lint(root, ['src', 'web', 'test', 'e2e']);
    const found = diagnostics
      .filter((d) => d.category === RULE)
      .map((d) => `${d.location.path}: ${d.message}`);
    expect(found).toEqual([]);
  });
});
