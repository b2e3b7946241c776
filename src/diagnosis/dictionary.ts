import { existsSync } from 'node:fs';
import { join } from 'node:path';
import type { Board } from '../schemas/board.js';
import { buildCircuit, measureAll, modelNameFor, OPAMP_PACKAGES, resolveOpAmp, testPointsFor, withSubstitutions } from '../board/index.js';
import { compileCircuit, solveDC, type DcSolution } from '../circuit/index.js';
import { expectBands, type Band } from '../circuit/analysis/expect-bands.js';
import { isSolverFailure } from '../circuit/errors.js';
import { applyFault, faultLink, type FaultLink } from './apply-fault.js';
import { faultyBoardReadings, type FaultyReadings, type SavedPlans } from './faulty-board-readings.js';
import { faultyOhmmeterReadings, healthyOhmmeterPoints } from './ohmmeter-readings.js';
import { ConditionSolvers } from './condition-solvers.js';
import { DEFAULT_NO_FAULT_PRIOR } from './fault-modes.js';
import type { Fault } from './fault.js';
import { faultsFor } from './faults-for.js';
import { createValueFaultSolver, faultedResistance } from './value-fault-solver.js';
import { NO_FAULT, type FaultDictionary, type Hypothesis, type Observable } from './dictionary-model.js';
import { DEFAULT_METER } from './meter.js';
import { dictionaryKey, loadDictionary, saveDictionary } from '../cache/dictionary-cache.js';

export interface DictionaryOptions {
  /** Conditions to predict; every condition of the board when absent. */
  conditions?: string[];
  /** Parts replaced before anything else (designator → value), as the person has the board. */
  substitutions?: Record<string, number | string>;
  /** Candidate faults; faultsFor(board) when absent. */
  faults?: Fault[];
  /** Share of the prior for "no fault"; default 5 %. */
  noFaultPrior?: number;
  /**
   * Healthy bands per test point and condition. Default: worst-case bands from expectBands with no
   * Monte Carlo (the band edges are what the spread estimate needs; the 99 % interval is not).
   */
  bands?: Band[];
  /**
   * Keep the built dictionary in this folder and reuse it on later runs (see dictionary-cache.ts);
   * `version` is the program's version, part of the key. Off unless given.
   */
  diskCache?: { dir: string; version: string };
}

export interface BuiltDictionary extends FaultDictionary {
  /** The board the predictions were made on (substitutions applied). */
  board: Board;
  /** faults[i] is hypotheses[i + 1]. */
  faults: Fault[];
  /** Per hypothesis, the conditions under which the solver could not settle the faulty circuit. */
  unsettled: Map<string, string[]>;
  /** Conditions left out because the healthy board itself could not be solved in them. */
  skippedConditions: string[];
}

/**
 * The fault dictionary (simulation before test; Bandler & Salama, Proc. IEEE 73(8), 1985): for the
 * healthy board and every candidate single fault, the reading a meter would show at every test
 * point under every condition in play. Each faulty board is solved by plain Newton warm-started
 * from the healthy solution of the same condition; a fault that only changes a resistor's value is
 * solved on the healthy circuit compiled once per condition, with the value written in place
 * (value-fault-solver.ts). Where plain Newton from the healthy point fails (about one faulty
 * circuit in eight on the demo board), the fault's own operating point under another condition
 * fixed by the board is tried as the start (startingConditions; first, when plain Newton did not
 * settle the fault there either), then the faulted resistor is
 * walked in from its healthy value (value-walk.ts), and only then the solver's gmin and source
 * stepping (faulty-board-readings.ts). A circuit already solved in a condition (circuitKey) is not
 * solved again.
 * A fault whose circuit does not settle stays in, predicting NaN there ("unpredictable"), so the
 * ranking neither drops nor favours it. Results are cached per board content, substitutions and
 * conditions.
 */
export function buildDictionary(board: Board, options: DictionaryOptions = {}): BuiltDictionary {
  const subject = options.substitutions && Object.keys(options.substitutions).length > 0 ? withSubstitutions(board, options.substitutions) : board;
  const key = cacheKey(subject, options);
  const cached = key === undefined ? undefined : cache.get(key);
  if (cached) return cached;
  const disk = options.diskCache && key !== undefined ? { ...options.diskCache, key: dictionaryKey(subject, options.conditions, options.noFaultPrior, options.diskCache.version) } : undefined;
  const stored = disk && loadDictionary(disk.dir, disk.key, subject);
  const built = stored || build(subject, options);
  if (disk && !stored) saveDictionary(disk.dir, disk.key, built);
  if (key !== undefined) {
    cache.set(key, built);
    if (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value!);
  }
  return built;
}

/** Whether buildDictionary would find this dictionary ready (in memory or on disk) instead of solving. */
export function dictionaryReady(board: Board, options: DictionaryOptions = {}): boolean {
  const subject = options.substitutions && Object.keys(options.substitutions).length > 0 ? withSubstitutions(board, options.substitutions) : board;
  const key = cacheKey(subject, options);
  if (key === undefined) return false;
  if (cache.has(key)) return true;
  if (!options.diskCache) return false;
  return existsSync(join(options.diskCache.dir, `${dictionaryKey(subject, options.conditions, options.noFaultPrior, options.diskCache.version)}.json`));
}

const CACHE_SIZE = 8;
const cache = new Map<string, BuiltDictionary>();

/** Forgets the dictionaries held in memory (the disk cache, if any, stays). */
export function clearDictionaryCache(): void {
  cache.clear();
}

/** Only the default fault list and bands are cached: those are the ones derived from the board alone. */
function cacheKey(board: Board, options: DictionaryOptions): string | undefined {
  if (options.faults || options.bands) return undefined;
  return JSON.stringify([board, options.conditions ?? null, options.noFaultPrior ?? null]);
}

function build(board: Board, options: DictionaryOptions): BuiltDictionary {
  const faults = options.faults ?? faultsFor(board);
  const span = Math.max(...board.rails.map((r) => Math.abs(r.volts))) + 1;

  const observables: Observable[] = [];
  const nominal: number[] = [];
  const warm = new Map<string, DcSolution | undefined>();
  const conditions: string[] = [];
  const skipped: string[] = [];
  for (const condition of options.conditions ?? board.conditions.map((c) => c.id)) {
    // A condition the healthy board itself cannot be solved in predicts nothing; it is left out and said so.
    let readings: Record<string, number>;
    let bands: Band[];
    try {
      const initial = healthySolution(board, condition);
      readings = measureAll(board, condition, { initial });
      bands = options.bands?.filter((b) => b.condition === condition) ?? expectBands(board, { condition, samples: 0 });
      warm.set(condition, initial);
    } catch (error) {
      if (!isSolverFailure(error)) throw error;
      skipped.push(condition);
      continue;
    }
    conditions.push(condition);
    const bandOf = new Map(bands.map((b) => [b.id, b]));
    for (const tp of testPointsFor(board, condition)) {
      const band = bandOf.get(tp.id);
      const value = readings[tp.id];
      const unit = tp.quantity === 'voltage' ? 'V' : 'Ω';
      const halfWidth = band && Number.isFinite(band.max - band.min) ? (band.max - band.min) / 2 : 0;
      const edges = band && Number.isFinite(band.max - band.min) ? { min: band.min, max: band.max } : {};
      observables.push({ testPoint: tp.id, condition, unit, access: tp.access, nominal: value, halfWidth, ...edges, span: unit === 'V' ? span : DEFAULT_METER.maxOhms });
      nominal.push(value);
    }
  }

  const unsettled = new Map<string, string[]>();
  const hypotheses: Hypothesis[] = [{ id: NO_FAULT, part: NO_FAULT, mode: NO_FAULT, fault: 'no fault', prior: 0, predictions: nominal }];
  // Value-only faults first, in place; the rest, and any value fault that did not settle in place,
  // take the full rebuild below.
  const quick = valueFaultPredictions(board, conditions, faults);
  // Per condition, the readings of every circuit solved so far by its netlist: a fault whose
  // circuit is one already solved (the healthy one, with the op-amps out of an unpowered board;
  // two parallel capacitors' shorts) has exactly those readings, the solve being a function of the
  // netlist and its starts alone. undefined: that circuit did not settle.
  const solved = new Map(board.conditions.map((c) => [c.id, new Map<string, FaultyReadings | undefined>()]));
  for (const condition of conditions) {
    const readings: Record<string, number> = {};
    const at = observables.findIndex((o) => o.condition === condition);
    testPointsFor(board, condition).forEach((tp, j) => (readings[tp.id] = nominal[at + j]));
    solved.get(condition)!.set(circuitKey(board, condition), { readings, unknowns: warm.get(condition)?.unknowns });
  }
  /** The faulty board's readings in a condition, through the netlist cache. */
  const ohmmeterPoints = new Map<string, Map<string, DcSolution>>();
  const solveIn = (
    faulty: Board,
    condition: string,
    initial: DcSolution | undefined,
    link: FaultLink | undefined,
    elsewhere?: () => Record<string, number> | undefined,
    plans?: SavedPlans,
    solvers?: ConditionSolvers,
    elsewhereFirst?: boolean,
  ) => {
    const key = circuitKey(faulty, condition);
    const seen = solved.get(condition)!;
    if (seen.has(key)) return seen.get(key);
    let solution: FaultyReadings | undefined;
    try {
      if (!board.conditions.find((c) => c.id === condition)?.powered) {
        if (!ohmmeterPoints.has(condition)) ohmmeterPoints.set(condition, healthyOhmmeterPoints(board, condition));
        solution = { readings: faultyOhmmeterReadings(faulty, condition, ohmmeterPoints.get(condition)!) };
      } else {
        solution = faultyBoardReadings(faulty, condition, initial, link, undefined, elsewhere, plans, solvers, elsewhereFirst);
      }
    } catch (error) {
      if (!isSolverFailure(error)) throw error;
    }
    seen.set(key, solution);
    return solution;
  };
  const starts = startingConditions(board, warm);
  // For the faults that get offset variants: the fault's own solves, which the variants start from.
  const nominalSolves = new Map<number, (condition: string) => FaultyReadings>();
  faults.forEach((fault, i) => {
    let faulty: Board | undefined;
    let link: FaultLink | undefined;
    let solvers: ConditionSolvers | undefined;
    const faultyBoard = () => {
      if (!faulty) {
        faulty = applyFault(board, fault);
        link = faultLink(board, faulty, fault);
      }
      return faulty;
    };
    // The fault solved under a condition other conditions start from (see startingConditions).
    const solvedAt = new Map<string, FaultyReadings>();
    const at = (condition: string): FaultyReadings => {
      let solution = solvedAt.get(condition);
      if (!solution) {
        const from = starts.get(condition);
        const other = from && at(from.condition);
        solvers ??= new ConditionSolvers(faultyBoard());
        solution = solveIn(faultyBoard(), condition, starts.warm(condition), link, other && (() => other.unknowns), from?.plans ? other?.plans : undefined, solvers, other?.fromHealthy === false) ?? { readings: {} };
        solvedAt.set(condition, solution);
      }
      return solution;
    };
    if (balancedAmplifier(board, fault)) nominalSolves.set(i, at);
    const predictions: number[] = [];
    for (const condition of conditions) {
      const fast = quick.get(condition)?.[i];
      if (fast) {
        predictions.push(...fast);
        continue;
      }
      const readings = warm.get(condition) ? at(condition).readings : solveIn(faultyBoard(), condition, undefined, link)?.readings;
      const settled = readings && Object.keys(readings).length === testPointsFor(board, condition).length;
      if (!settled) unsettled.set(fault.id, [...(unsettled.get(fault.id) ?? []), condition]);
      for (const tp of testPointsFor(board, condition)) predictions.push(settled ? readings[tp.id] : NaN);
    }
    hypotheses.push({ id: fault.id, part: fault.part, mode: fault.mode, fault: fault.fault, prior: fault.prior, predictions });
  });
  faults.forEach((fault, i) => {
    const amplifier = balancedAmplifier(board, fault);
    if (!amplifier) return;
    const faulty = applyFault(board, fault);
    const variants = offsetVariants(faulty, amplifier, conditions, hypotheses[i + 1].predictions, board, warm, faultLink(board, faulty, fault), nominalSolves.get(i));
    if (variants) hypotheses[i + 1].variants = variants;
  });

  // Priors: faults share 1 − P(no fault) in proportion to their weights.
  const noFault = options.noFaultPrior ?? DEFAULT_NO_FAULT_PRIOR;
  const weight = faults.reduce((a, f) => a + f.prior, 0);
  hypotheses[0].prior = faults.length === 0 ? 1 : noFault;
  for (let i = 1; i < hypotheses.length; i++) hypotheses[i].prior = weight > 0 ? ((1 - noFault) * hypotheses[i].prior) / weight : 0;

  return { board, observables, hypotheses, faults, unsettled, skippedConditions: skipped };
}

/**
 * Value-only faults solved on one compiled circuit per condition, values written in place; per
 * condition, faults[i]'s readings or undefined where a fault takes the full rebuild (not a value
 * change, or it did not settle in place). One condition at a time: a solver's recent LU pivot plans
 * then keep fitting from one fault to the next (≈10 % faster than fault by fault on the demo board).
 * A fault plain Newton cannot settle from the healthy point starts again from its own point under
 * the board's first powered condition, solved in place there too: a condition fixed by the board,
 * as in startingConditions.
 */
function valueFaultPredictions(board: Board, conditions: string[], faults: Fault[]): Map<string, Array<number[] | undefined>> {
  const out = new Map<string, Array<number[] | undefined>>();
  if (!faults.some((f) => faultedResistance(f, 1) !== undefined)) return out;
  const solvers = new Map(conditions.map((c) => [c, createValueFaultSolver(board, c)]));
  const ref = board.conditions.find((c) => c.powered)?.id;
  const refSolver = ref === undefined ? undefined : solvers.has(ref) ? solvers.get(ref) : createValueFaultSolver(board, ref);
  const refPoints = new Map<number, Record<string, number> | undefined>();
  const refPoint = (i: number) => {
    if (!refPoints.has(i)) refPoints.set(i, refSolver?.predict(faults[i]) ? refSolver.settledUnknowns() : undefined);
    return refPoints.get(i);
  };
  for (const condition of conditions) {
    const solver = solvers.get(condition);
    if (!solver) continue;
    const isRef = condition === ref;
    out.set(
      condition,
      faults.map((f, i) => {
        const readings = solver.predict(f, isRef ? undefined : () => refPoint(i));
        if (isRef && readings && !refPoints.has(i)) refPoints.set(i, solver.settledUnknowns());
        return readings;
      }),
    );
  }
  return out;
}

/**
 * Where each powered condition's faulty circuits start when plain Newton from the healthy point
 * fails, fixed by the board alone so that a prediction does not depend on which other conditions
 * the dictionary was built for (restrict-dictionary.ts relies on that): the fault's own operating
 * point under the first powered condition, in board order, whose healthy circuit has the same
 * matrix pattern (a knob apart), with the pivot plans that solve left; the first condition of a
 * pattern starts from the board's first powered condition, without its plans.
 */
function startingConditions(board: Board, warm: Map<string, DcSolution | undefined>) {
  const powered = board.conditions.filter((c) => c.powered).map((c) => c.id);
  const patterns = new Map<string, string>();
  const from = new Map<string, { condition: string; plans: boolean }>();
  const firstOf = new Map<string, string>();
  for (const id of powered) {
    const pattern = Buffer.from(compileCircuit(buildCircuit(board, id).circuit).pattern).toString('base64');
    patterns.set(id, pattern);
    const first = firstOf.get(pattern);
    if (first === undefined) {
      firstOf.set(pattern, id);
      if (id !== powered[0]) from.set(id, { condition: powered[0], plans: false });
    } else {
      from.set(id, { condition: first, plans: true });
    }
  }
  const healthy = new Map(warm);
  return {
    get: (condition: string) => from.get(condition),
    /** The healthy point of a powered condition (solved here when the dictionary did not ask for it). */
    warm(condition: string): DcSolution | undefined {
      if (!healthy.has(condition)) {
        try {
          healthy.set(condition, healthySolution(board, condition));
        } catch (error) {
          if (!isSolverFailure(error)) throw error;
          healthy.set(condition, undefined);
        }
      }
      return healthy.get(condition);
    },
  };
}

/**
 * The amplifier a fault leaves open loop, its output hanging on its own input offset: a bridge
 * between its two inputs (no difference left to amplify), a resistor from its output to its − input
 * gone open (no feedback left), or a resistor from its − input to anywhere but its output shorted
 * (the − input pinned, as in a comparator). With nominal models (offset at its nominal value) such an
 * output sits wherever the balance puts it, while a real part, with an offset a few millivolts either
 * way, drives it to one rail or the other. These faults get two more prediction vectors, the
 * package's offset at either end of its stated spread (vosMax). Only these: solving every fault three
 * times would triple the dictionary's build. Found from the netlist alone, so a fault whose amplifier
 * keeps another feedback path (a diode, say) gets variants too; they then differ from its nominal
 * prediction by the offset's own small effect, which changes nothing in the ranking.
 */
function balancedAmplifier(board: Board, fault: Fault): string | undefined {
  if (joinsInputs(board, fault)) return fault.part;
  if (fault.mode !== 'open' && fault.mode !== 'short') return undefined;
  const part = board.parts.find((p) => p.ref === fault.part);
  if (part?.kind !== 'resistor') return undefined;
  const nets = Object.values(part.pins);
  if (nets.length !== 2) return undefined;
  for (const amp of board.parts) {
    const pkg = OPAMP_PACKAGES[amp.kind];
    for (const a of pkg?.amplifiers ?? []) {
      const minus = amp.pins[a.minus];
      const out = amp.pins[a.out];
      if (!nets.includes(minus)) continue;
      const other = nets[0] === minus ? nets[1] : nets[0];
      if (fault.mode === 'open' ? other === out : other !== out) return amp.ref;
    }
  }
  return undefined;
}

function joinsInputs(board: Board, fault: Fault): boolean {
  if (fault.mode !== 'bridge' || !fault.pins) return false;
  const part = board.parts.find((p) => p.ref === fault.part);
  const pkg = part && OPAMP_PACKAGES[part.kind];
  if (!pkg) return false;
  const [a, b] = fault.pins;
  return pkg.amplifiers.some((amp) => (amp.plus === a && amp.minus === b) || (amp.plus === b && amp.minus === a));
}

function offsetVariants(
  faulty: Board,
  ref: string,
  conditions: string[],
  nominal: number[],
  board: Board,
  warm: Map<string, DcSolution | undefined>,
  link: FaultLink | undefined,
  nominalSolve: ((condition: string) => FaultyReadings) | undefined,
): number[][] | undefined {
  const part = faulty.parts.find((p) => p.ref === ref);
  const name = part && modelNameFor(part);
  const params = name === undefined ? undefined : resolveOpAmp(faulty, name);
  if (!part || name === undefined || !params?.vosMax) return undefined;
  const powered = new Set(faulty.conditions.filter((c) => c.powered).map((c) => c.id));
  return [1, -1].map((sign) => {
    // A model of its own for this package only: the other amplifiers on the board keep their offsets.
    const shifted = `${name}~vos${sign > 0 ? '+' : '-'}`;
    const variant: Board = {
      ...faulty,
      opampModels: { ...faulty.opampModels, [shifted]: { ...(faulty.opampModels[name] ?? {}), ...params, vos: params.vos + sign * params.vosMax! } },
      parts: faulty.parts.map((p) => (p === part ? { ...p, model: shifted } : p)),
    };
    const predictions: number[] = [];
    const solvers = new ConditionSolvers(variant);
    let at = 0;
    for (const condition of conditions) {
      const points = testPointsFor(board, condition);
      // Unpowered, an offset moves nothing: the ohmmeter readings are the nominal ones.
      if (!powered.has(condition)) {
        predictions.push(...nominal.slice(at, at + points.length));
      } else {
        let readings: Record<string, number> | undefined;
        try {
          // The fault with its nominal offset, solved in the same condition, is the variant's
          // fallback start and lends it its pivot plans (only the offset differs).
          const own = nominalSolve?.(condition);
          readings = faultyBoardReadings(variant, condition, warm.get(condition), link, undefined, own && (() => own.unknowns), own?.plans, solvers).readings;
        } catch (error) {
          if (!isSolverFailure(error)) throw error;
        }
        for (const tp of points) predictions.push(readings ? readings[tp.id] : NaN);
      }
      at += points.length;
    }
    return predictions;
  });
}

/**
 * What the board's circuit in a condition is made of, as text: equal keys, equal circuits, so equal
 * readings. Powered, the parts (less where they sit) and rails, every other field being the
 * board's own for all its faults; unpowered, the circuit itself, which leaves the op-amps out, so
 * a dead amplifier's board is the healthy one there. An unpowered board's ohmmeter circuits are its
 * elements with the meter added and floating nodes tied (ties come last, named apart from parts),
 * so equal keys mean equal circuits for every test point too.
 */
const poweredKeys = new WeakMap<Board, string>();

function circuitKey(board: Board, condition: string): string {
  if (board.conditions.find((c) => c.id === condition)?.powered) {
    let key = poweredKeys.get(board);
    if (key === undefined) {
      key = JSON.stringify([board.parts.map(({ where: _where, ...part }) => part), board.rails]);
      poweredKeys.set(board, key);
    }
    return key;
  }
  const { circuit } = buildCircuit(board, condition);
  return JSON.stringify([circuit.elements, circuit.models]);
}

/** The healthy operating point of a powered condition, to start each faulty solve from. */
function healthySolution(board: Board, condition: string): DcSolution | undefined {
  if (!board.conditions.find((c) => c.id === condition)?.powered) return undefined;
  return solveDC(buildCircuit(board, condition).circuit);
}
