/**
 * The crew server's flags: a mistake is named on stderr with exit code 2 and the server does not start
 * (the command line's convention, src/cli/README.md). Node's own util.parseArgs reads them.
 */
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const script = join(import.meta.dirname, '..', '..', 'dist-server', 'server.mjs');
const run = (args: string[]) =>
  spawnSync(process.execPath, [script, ...args], { encoding: 'utf8', timeout: 20_000 });

describe('crew server flags', () => {
  it.each([
    [['--bogus'], /Unknown option '--bogus'/],
    [['--port'], /--port <value>' argument missing/],
    [['--port', '99999'], /--port: a port number 0–65535, got "99999"/],
    [['--app', '/nonexistent-folder'], /--app: no index.html in "\/nonexistent-folder"/],
    [['--allow-origin', 'app.example.org'], /--allow-origin: an origin such as/],
    [['stray'], /Unexpected argument 'stray'/],
  ])('%j is refused by name, exit 2, nothing started', (args, message) => {
    const r = run(args);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(message);
    expect(r.stdout).toBe('');
  });
});
