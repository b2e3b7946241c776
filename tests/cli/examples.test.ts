import { describe, expect, it } from 'vitest';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { run } from '../../src/cli/run.js';
import { memoryIo } from '../../src/cli/io.js';
import { ROOT } from '../e2e/terminal.js';

/**
 * Every answers file in examples/ is named "<tree>-<what it shows>.json" and replays on the demo
 * board to a conclusion, with no step left unanswered: the README points people at them.
 */
const EXAMPLES = join(ROOT, 'examples');
const CONCLUSIONS: Record<string, string> = {
  'first-power-up-healthy.json': 'The board powers up healthy',
  'noisy-makeup-hiss.json': "The hiss is this design's own at this gain",
};

describe('the example answers files', () => {
  it('has a known conclusion for every file', () => {
    expect(readdirSync(EXAMPLES).filter((f) => f.endsWith('.json')).sort()).toEqual(Object.keys(CONCLUSIONS).sort());
  });

  for (const [file, conclusion] of Object.entries(CONCLUSIONS)) {
    it(`${file} replays to "${conclusion}"`, async () => {
      const tree = file.replace(/-[a-z]+\.json$/, '');
      const io = memoryIo({ cwd: ROOT });
      expect(await run(['walk', '--tree', tree, '--answers', join(EXAMPLES, file), '--no-cache'], io)).toBe(0);
      expect(io.out()).toContain(`Conclusion: ${conclusion}`);
      expect(io.out()).not.toContain('Stopped at');
    }, 300_000);
  }
});
