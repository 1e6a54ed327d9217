/**
 * Vitest global setup: builds the command line (dist-cli/) and the crew server (dist-server/) once before
 * any test file runs. Test files that run a built program used to rebuild it in their own beforeAll; two
 * files doing so in parallel could empty the folder under a third that was running it.
 */
import { execFileSync } from 'node:child_process';
import { join } from 'node:path';

export default function setup(): void {
  const cwd = join(import.meta.dirname, '..');
  execFileSync('npm', ['run', 'build:cli'], { cwd, stdio: 'ignore' });
  execFileSync('npm', ['run', 'build:server'], { cwd, stdio: 'ignore' });
}
