import type { Board } from '../schemas/board.js';
import { ambiguityGroups } from './ambiguity.js';
import { buildDictionary, type BuiltDictionary } from './dictionary.js';
import { faultLabel, NO_FAULT, rowView, type Reading } from './dictionary-model.js';
import { DEFAULT_METER, type MeterSpec } from './meter.js';
import { nextProbe } from './next-probe.js';
import { entropyBits, locateReadings, rowPosterior } from './posterior.js';
import type { RankResult, Suspect, SuspectGroup } from './rank-result.js';
import { explain } from './why.js';
import { unexplainedReadings } from './unexplained.js';

export interface RankOptions {
  /** Parts replaced on the board as the person has it (designator → value). */
  substitutions?: Record<string, number | string>;
  /** Conditions the dictionary covers (and probes may be suggested in); every condition by default. */
  conditions?: string[];
  /** The meter's accuracy; default ±(0.5 % + 2 counts), 2000 counts. */
  meter?: MeterSpec;
  /** A dictionary already built for this board (skips the cache lookup). */
  dictionary?: BuiltDictionary;
  /** Most suspects listed; default 10. */
  limit?: number;
  /** Suspects below this probability are not listed (the first always is); default 0.001. */
  minProbability?: number;
  /** Share of the prior for "no fault"; default 5 %. */
  noFaultPrior?: number;
  /** Keep the dictionary on disk between runs (see buildDictionary). */
  diskCache?: { dir: string; version: string };
  /** The board is known to be faulty: "no fault" is left out (see PosteriorOptions.faultPresent). */
  faultPresent?: boolean;
}

/** Hypotheses below this share of the leader are out of the running: they are not grouped or probed for. */
const LIVE = 1e-7;
const MAX_LIVE = 150;

/**
 * Ranks single-fault suspects from readings (under one or several conditions): the posterior of each
 * candidate fault and of "no fault", ambiguity groups over every reading in play, a plain "why" with
 * numbers for each suspect, and the next probe expected to narrow things most.
 */
export function rankSuspects(board: Board, readings: Reading[], options: RankOptions = {}): RankResult {
  const meter = options.meter ?? DEFAULT_METER;
  const dict = options.dictionary ?? buildDictionary(board, {
      substitutions: options.substitutions,
      conditions: options.conditions,
      noFaultPrior: options.noFaultPrior,
      diskCache: options.diskCache,
    });
  const where = locateReadings(dict, readings);
  const both = rowPosterior(dict, readings, { meter, faultPresent: options.faultPresent });
  const p = both.hypotheses;
  const order = p.map((_, i) => i).sort((a, b) => p[b] - p[a]);
  const live = order.filter((i) => p[i] >= p[order[0]] * LIVE).slice(0, MAX_LIVE);

  const groupOf = ambiguityGroups(dict, live, meter);
  const groups = new Map<number, number[]>();
  for (const h of live) groups.set(groupOf.get(h)!, [...(groups.get(groupOf.get(h)!) ?? []), h]);
  const ranked = [...groups.values()].sort((a, b) => mass(b, p) - mass(a, p));
  const numberOf = new Map<number, number>();
  ranked.forEach((members, g) => members.forEach((h) => numberOf.set(h, g + 1)));

  const limit = options.limit ?? 10;
  const floor = options.minProbability ?? 0.001;
  const shown = live.filter((h, k) => k === 0 || p[h] >= floor).slice(0, limit);
  const suspects: Suspect[] = shown.map((h) => {
    const hyp = dict.hypotheses[h];
    const twins = ranked[numberOf.get(h)! - 1].filter((t) => t !== h).map((t) => name(dict, t));
    return {
      part: hyp.part,
      fault: hyp.fault,
      probability: round(p[h]),
      group: numberOf.get(h)!,
      why: explain(dict, h, readings, where, meter, twins),
      mode: hyp.mode,
      id: hyp.id,
    };
  });
  const groupList: SuspectGroup[] = ranked
    .map((members, g) => ({
      group: g + 1,
      probability: round(mass(members, p)),
      members: members.map((h) => dict.hypotheses[h].id),
      labels: members.map((h) => faultLabel(dict.hypotheses[h])),
      parts: [...new Set(members.map((h) => dict.hypotheses[h].part))],
    }))
    .filter((g) => g.members.some((id) => shown.some((h) => dict.hypotheses[h].id === id)));

  // The look-ahead works on rows: where a probe's reading would land depends on which variant holds.
  const next = nextProbe(rowView(dict).rows, both.rows, { meter, measured: new Set(where), currentCondition: readings.at(-1)?.condition });
  const unexplained = unexplainedReadings(dict, readings, where, meter);
  return { suspects, groups: groupList, ...(next ? { next } : {}), ...(unexplained.length ? { unexplained } : {}), entropyBits: round(entropyBits(p)) };
}

const mass = (members: number[], p: number[]) => members.reduce((a, h) => a + p[h], 0);
const round = (x: number) => Math.round(x * 10000) / 10000;
const name = (dict: BuiltDictionary, h: number) => {
  const hyp = dict.hypotheses[h];
  return hyp.id === NO_FAULT ? 'a healthy board' : faultLabel(hyp);
};
