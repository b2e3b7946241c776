/**
 * Our small-signal AC analysis against the reference simulator on the golden netlists that carry
 * an `.ac` card (RC, RLC, op-amp and transistor stages), at every frequency of the card's sweep.
 * Reference: ngspice 45 via eecircuit-engine 1.8.0 (`.ac lin 1 f f` per frequency).
 * Agreement required: magnitude within 0.1 dB and phase within 0.5° at every node whose response
 * is above 1e-9 of the excitation (below that, phase means nothing and both must just be tiny).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { solveAC, solveDC } from '../../src/circuit/index.js';
import { REFERENCE, startNgspice } from './ngspice.js';
import { referenceAc, referenceNetlists, sweepFrequencies } from './reference-netlists.js';

const acNetlists = referenceNetlists().filter((n) => n.analyses.some((a) => a.kind === 'ac'));
const TINY = 1e-9;

const db = (x: number) => 20 * Math.log10(x);
const angleBetween = (a: number, b: number) => Math.abs(((a - b + 540) % 360) - 180);

describe(`small-signal AC vs ${REFERENCE}`, () => {
  beforeAll(() => startNgspice(), 30_000);

  it('has at least four AC golden netlists', () => {
    expect(acNetlists.length).toBeGreaterThanOrEqual(4);
  });

  it.each(acNetlists.map((n) => [n.file, n] as const))('%s', async (_file, entry) => {
    const card = entry.analyses.find((a) => a.kind === 'ac')!;
    if (card.kind !== 'ac') throw new Error('unreachable');
    const op = solveDC(entry.circuit);
    const off: string[] = [];
    let compared = 0;
    for (const f of sweepFrequencies(card)) {
      const ours = solveAC(entry.circuit, f, { op });
      const ref = await referenceAc(entry, f);
      for (const [node, mine] of Object.entries(ours.nodes)) {
        if (node === '0') continue;
        const theirs = ref[node];
        expect(theirs, `ngspice reports node ${node} at ${f} Hz`).toBeDefined();
        if (theirs.mag < TINY && mine.mag < TINY) continue;
        compared++;
        const dDb = Math.abs(db(mine.mag) - db(theirs.mag));
        const dPhase = angleBetween(mine.phaseDeg, theirs.phaseDeg);
        if (!(dDb <= 0.1) || !(dPhase <= 0.5)) {
          off.push(`${node} at ${f.toPrecision(4)} Hz: ours ${db(mine.mag).toFixed(3)} dB ${mine.phaseDeg.toFixed(2)}°, ngspice ${db(theirs.mag).toFixed(3)} dB ${theirs.phaseDeg.toFixed(2)}°`);
        }
      }
    }
    expect(compared).toBeGreaterThan(0);
    expect(off, off.join('\n')).toEqual([]);
  });
});
