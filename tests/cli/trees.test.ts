import { describe, expect, it } from 'vitest';
import { run } from '../../src/cli/run.js';
import { memoryIo } from '../../src/cli/io.js';

describe('voltwalk trees', () => {
  it('lists every tree, one line each: id and symptom', async () => {
    const io = memoryIo();
    expect(await run(['trees'], io)).toBe(0);
    const lines = io.out().trimEnd().split('\n');
    expect(lines).toHaveLength(8);
    expect(lines.find((l) => l.startsWith('no-output '))).toMatch(/^no-output\s+No output at all$/);
    expect(io.err()).toBe('');
  });

  it('--json gives id, symptom, description, file and step count', async () => {
    const io = memoryIo();
    expect(await run(['trees', '--json'], io)).toBe(0);
    const { trees } = JSON.parse(io.out()) as { trees: Array<{ id: string; symptom: string; file: string; steps: number }> };
    expect(trees.map((t) => t.id)).toContain('first-power-up');
    for (const t of trees) {
      expect(t.file).toBe(`${t.id}.json`);
      expect(t.steps).toBeGreaterThan(10);
    }
  });

  it('an unknown option is a usage error', async () => {
    const io = memoryIo();
    expect(await run(['trees', '--jsno'], io)).toBe(2);
    expect(io.err()).toContain('jsno');
  });
});
