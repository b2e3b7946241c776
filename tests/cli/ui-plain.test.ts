import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { run } from '../../src/cli/run.js';
import { memoryIo } from '../../src/cli/io.js';
import { loadAllTrees } from '../../src/engine/load-tree.js';

describe('voltwalk with stdout not a terminal', () => {
  it('prints the board, every symptom and how to walk without the screens, exit 0, no frames', async () => {
    const home = mkdtempSync(join(tmpdir(), 'voltwalk-plain-'));
    writeFileSync(join(home, 'broken.json'), 'not json');
    const io = memoryIo({ env: { VOLTWALK_HOME: home } });
    expect(await run([], io)).toBe(0);
    const out = io.out();
    expect(out).toMatch(/^voltwalk — guided fault-finding \(plain output: not a terminal\)\nBoard: Wenlow Tamp compressor \(demo kit\) · rails \+12 V, −12 V · \d+ parts\n/);
    for (const t of loadAllTrees()) expect(out).toContain(`${t.id}`);
    expect(out).toContain('voltwalk walk --tree');
    expect(out).toContain(`! ${join(home, 'broken.json')}: the session file is damaged (not valid JSON) (left as it is)`);
    // No cursor movement or colour codes: plain text only.
    expect(out).not.toMatch(/\u001B\[/);
  });
});
