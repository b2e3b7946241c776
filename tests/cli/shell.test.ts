import { describe, expect, it } from 'vitest';
import { run, version } from '../../src/cli/run.js';
import { colourAllowed, memoryIo } from '../../src/cli/io.js';
import { readFileSync } from 'node:fs';

describe('voltwalk CLI shell', () => {
  it('--help lists every command with its summary, exit 0', async () => {
    const io = memoryIo();
    expect(await run(['--help'], io)).toBe(0);
    for (const name of ['check', 'value', 'parts', 'solve', 'export', 'expect', 'trees', 'walk', 'rank', 'summary']) {
      expect(io.out()).toMatch(new RegExp(`^  ${name} +\\S`, 'm'));
    }
  });

  it('--version prints the package version', async () => {
    const io = memoryIo();
    expect(await run(['--version'], io)).toBe(0);
    const pkg = JSON.parse(readFileSync('package.json', 'utf8'));
    expect(io.out().trim()).toBe(pkg.version);
    expect(version()).toBe(pkg.version);
  });

  it('an unknown command is a usage error naming the accepted commands, exit 2', async () => {
    const io = memoryIo();
    expect(await run(['wlak'], io)).toBe(2);
    expect(io.err()).toMatch(/unknown command "wlak" \(accepted: check, value/);
    expect(io.out()).toBe('');
  });

  it('an unknown option is a usage error, exit 2, no stack trace', async () => {
    const io = memoryIo();
    expect(await run(['value', '--jsn', '4k7'], io)).toBe(2);
    expect(io.err()).toMatch(/--jsn/);
    expect(io.err()).not.toMatch(/at .*\.ts:\d+/);
  });

  it('colour is off with NO_COLOR, TERM=dumb, or when not a terminal', () => {
    expect(colourAllowed(memoryIo({ isTTY: true, env: {} }))).toBe(true);
    expect(colourAllowed(memoryIo({ isTTY: true, env: { NO_COLOR: '' } }))).toBe(false);
    expect(colourAllowed(memoryIo({ isTTY: true, env: { TERM: 'dumb' } }))).toBe(false);
    expect(colourAllowed(memoryIo({ isTTY: false, env: {} }))).toBe(false);
  });
});
