import { describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { run } from '../../src/cli/run.js';
import { memoryIo } from '../../src/cli/io.js';

const fixtures = join(import.meta.dirname, '../fixtures/boards');

describe('voltwalk parts', () => {
  it('--json: one row per part with SI value, tolerance, stage and where', async () => {
    const io = memoryIo({ cwd: fixtures });
    expect(await run(['parts', '--board', 'small-amp.json', '--json'], io)).toBe(0);
    const { parts } = JSON.parse(io.out());
    expect(parts).toHaveLength(19);
    const r4 = parts.find((p: { ref: string }) => p.ref === 'R4');
    expect(r4).toMatchObject({ ref: 'R4', kind: 'resistor', value: 4700, tolerance: 0.01, stage: 'output', where: 'below RV1' });
    // IEC 60062: 4.7 kΩ ±1 % is yellow violet black brown brown (three figures for ±2 % and tighter).
    expect(r4.bands).toEqual(['yellow', 'violet', 'black', 'brown', 'brown']);
    const u1 = parts.find((p: { ref: string }) => p.ref === 'U1');
    expect(u1).toMatchObject({ kind: 'opamp-dual', value: null, tolerance: null, model: 'TL072', stage: 'input' });
    const c1 = parts.find((p: { ref: string }) => p.ref === 'C1');
    expect(c1).toMatchObject({ value: 10e-6, tolerance: 0.2 });
    for (const p of parts) expect(Object.keys(p)).toEqual(expect.arrayContaining(['ref', 'kind', 'value', 'tolerance', 'stage', 'where']));
  });
  it('text: grouped by stage, with formatted values, tolerance and bands', async () => {
    const io = memoryIo({ cwd: fixtures });
    expect(await run(['parts', '--board', 'small-amp.json'], io)).toBe(0);
    const lines = io.out().split('\n');
    expect(lines[0]).toBe('Small test amplifier — 19 parts');
    const stageLine = lines.indexOf('Input and inverter');
    expect(stageLine).toBeGreaterThan(0);
    const r3 = lines.find((l) => l.trimStart().startsWith('R3 '))!;
    // 22 kΩ ±5 %: red red orange gold (IEC 60062, two figures for ±5 %).
    expect(r3).toMatch(/R3\s+resistor\s+22 kΩ\s+±5 %\s+right of R2  \[red red orange gold\]$/);
    expect(lines.indexOf(lines.find((l) => l.includes(' R3 '))!)).toBeGreaterThan(stageLine);
    expect(lines.find((l) => l.trimStart().startsWith('RV1'))).toContain('Level; front panel');
  });
  it('a broken board: exit 1 with the problems, no stack trace', async () => {
    const io = memoryIo({ cwd: fixtures });
    expect(await run(['parts', '--board', 'broken-pin-no-net.json'], io)).toBe(1);
    expect(io.err()).toBe('voltwalk: broken-pin-no-net.json'.replace('broken', `${fixtures}/broken`) + ': parts[10].pins: R2 pin "2" is on no net (accepted: every pin of a resistor on a net: resistor pins "1", "2")\n');
  });
  it('without --board: the bundled demo board, every resistor with its bands', async () => {
    const io = memoryIo({ cwd: fixtures });
    expect(await run(['parts', '--json'], io)).toBe(0);
    const { board, parts } = JSON.parse(io.out());
    expect(board).toBe('wenlow-tamp');
    const resistors = parts.filter((p: { kind: string }) => p.kind === 'resistor');
    expect(resistors.length).toBeGreaterThan(0);
    for (const r of resistors) expect(r.bands?.length, r.ref).toBeGreaterThanOrEqual(4);
  });
  it('an unknown option is a usage error', async () => {
    const io = memoryIo({ cwd: fixtures });
    expect(await run(['parts', '--bord', 'x'], io)).toBe(2);
  });
});
