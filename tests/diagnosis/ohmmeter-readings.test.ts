import { describe, expect, it } from 'vitest';
import { DEMO_BOARD_FILE, loadBoard, measureAll } from '../../src/board/index.js';
import { applyFault, faultsFor } from '../../src/diagnosis/index.js';
import { faultyOhmmeterReadings, healthyOhmmeterPoints } from '../../src/diagnosis/ohmmeter-readings.js';

/**
 * Started from the healthy board's ohmmeter point instead of from zero, an unpowered faulty board
 * must read what measureAll reads, to within the solver's tolerance: twice SPICE's default RELTOL
 * (1e-3, common practice), the two starts each stopping anywhere within it. An overload (Infinity)
 * must be an overload both ways.
 */
const agree = (a: number, b: number) => (Number.isFinite(a) && Number.isFinite(b) ? Math.abs(a - b) <= 2e-3 * Math.max(Math.abs(a), Math.abs(b)) : a === b);

describe('ohmmeter readings of faulty boards, started from the healthy point', () => {
  const board = loadBoard(DEMO_BOARD_FILE);
  // Every fault kind that changes the unpowered circuit: opens, shorts, reversed parts, bridges.
  const faults = faultsFor(board).filter((_, i) => i % 9 === 0);

  it('read what measureAll reads from zero', () => {
    const healthy = healthyOhmmeterPoints(board, 'unpowered');
    expect(healthy.size).toBeGreaterThan(0);
    const off: string[] = [];
    for (const fault of faults) {
      const faulty = applyFault(board, fault);
      const got = faultyOhmmeterReadings(faulty, 'unpowered', healthy);
      const want = measureAll(faulty, 'unpowered');
      expect(Object.keys(got).sort()).toEqual(Object.keys(want).sort());
      for (const id of Object.keys(want)) if (!agree(got[id], want[id])) off.push(`${fault.id} ${id}: ${got[id]} vs ${want[id]}`);
    }
    expect(off).toEqual([]);
  }, 60_000);

  it('without a healthy point, are exactly measureAll', () => {
    for (const fault of faults.slice(0, 5)) {
      const faulty = applyFault(board, fault);
      expect(faultyOhmmeterReadings(faulty, 'unpowered', new Map())).toEqual(measureAll(faulty, 'unpowered'));
    }
  }, 60_000);
});
