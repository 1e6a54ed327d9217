/**
 * Vitest global setup: builds the command line (dist-cli/) once before any test file runs. Test files that
 * run the built `sure-enough` used to rebuild it in their own beforeAll; two files doing so in parallel
 * could empty dist-cli/ under a third that was running it.
 */
import { execFileSync } from 'node:child_process';
import { join } from 'node:path';

export default function setup(): void {
  execFileSync('npm', ['run', 'build:cli'], { cwd: join(import.meta.dirname, '..'), stdio: 'ignore' });
}
