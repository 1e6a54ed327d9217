#!/usr/bin/env node
// `npx sure-enough`: runs the command line bundled from src/cli/main.ts by `npm run build:cli`
// (which `npm ci` runs through the `prepare` script).
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const bundle = fileURLToPath(new URL('../../dist-cli/sure-enough.mjs', import.meta.url));
if (!existsSync(bundle)) {
  process.stderr.write('sure-enough: the command line is not built yet; run `npm run build:cli`\n');
  process.exit(2);
}
await import(bundle);
