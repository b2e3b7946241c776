/**
 * The one way tests run the reference simulator: ngspice 45, compiled to WebAssembly, in-process
 * through eecircuit-engine 1.8.0.
 *
 * Start it once per test file (`beforeAll(startNgspice, 20_000)`); it takes about 1.5 s. Runs are
 * queued, because one engine holds one netlist at a time.
 *
 * What this wrapper guards against, found by trying the engine:
 * - `runSim()` never throws. A netlist error shows up in `getError()` (with warnings and notes
 *   mixed in), and the result returned is whatever the last good run left in its raw file — a
 *   stale answer. So every run gets a unique title, and the result's title and plot name are
 *   checked. If no run has succeeded yet there is no raw file and `runSim()` never settles, so
 *   starting includes one known-good run, and every run has a time limit.
 * - A netlist with any non-ASCII character (an em dash in a title, a µ) makes the run never
 *   return, so such text is refused up front. Our writer only writes ASCII.
 * - `getError()` also carries harmless notes (gmin stepping, unknown model parameters); only lines
 *   starting "Error" or saying the run was interrupted count as failure.
 * - Results name vectors `v(node)` and `i(source)`, lower case; nodes inside subcircuits appear as
 *   `v(x1.node)`, kept under that name.
 * - ngspice analyses at 27 °C unless the netlist has `.temp`.
 */
import { Simulation, type ResultType } from 'eecircuit-engine';

export const REFERENCE = 'ngspice 45 via eecircuit-engine 1.8.0';

let engine: Promise<Simulation> | undefined;
let queue: Promise<unknown> = Promise.resolve();
let runs = 0;

/** Starts the shared engine (idempotent). */
export function startNgspice(): Promise<Simulation> {
  engine ??= (async () => {
    const sim = new Simulation();
    await sim.start();
    sim.setNetList('warm-up\nv1 1 0 1\nr1 1 0 1\n.op\n.end\n');
    await withTimeout(sim.runSim(), 'the warm-up run');
    return sim;
  })();
  return engine;
}

/** Longest a single run may take; a netlist ngspice struggles with fails the test instead of hanging it. */
export const RUN_TIME_LIMIT_MS = 60_000;

function withTimeout<T>(promise: Promise<T>, what: string): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  const limit = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new NgspiceError(`ngspice did not finish ${what} within ${RUN_TIME_LIMIT_MS / 1000} s`, [])), RUN_TIME_LIMIT_MS);
  });
  return Promise.race([promise, limit]).finally(() => clearTimeout(timer));
}

export class NgspiceError extends Error {
  constructor(
    message: string,
    readonly log: string[],
  ) {
    super(message);
    this.name = 'NgspiceError';
  }
}

export interface NgspiceRun {
  result: ResultType;
  /** Everything ngspice said on its error channel: warnings, notes (gmin stepping…). */
  log: string[];
}

const ANALYSIS_CARD = /^\s*\.(op|ac|tran|dc|noise|tf)\b/i;

/** Replaces the netlist's title and analysis cards, keeping everything else as written. */
export function withAnalysis(netlist: string, title: string, card: string): string {
  const lines = netlist.split(/\r\n|\r|\n/);
  const body = lines.slice(1).filter((l) => !ANALYSIS_CARD.test(l));
  const end = body.findIndex((l) => /^\s*\.end\s*$/i.test(l));
  if (end >= 0) body.splice(end, 0, card);
  else body.push(card, '.end');
  return [title, ...body].join('\n') + '\n';
}

/** Runs one netlist as given (its first line replaced by a unique title); throws on any ngspice error. */
export async function runNgspice(netlist: string, card: string, plotName: string): Promise<NgspiceRun> {
  const sim = await startNgspice();
  const title = `reference run ${++runs}`;
  const text = withAnalysis(netlist, title, card);
  const foreign = /[^\x00-\x7f]/.exec(text);
  if (foreign) throw new NgspiceError(`netlist has a non-ASCII character "${foreign[0]}"; the in-process ngspice never returns from such text`, []);
  const job = queue.then(async () => {
    sim.setNetList(text);
    const result = await withTimeout(sim.runSim(), `"${netlist.split('\n')[0]}"`);
    return { result, log: sim.getError().filter((l) => l.trim() !== '') };
  });
  queue = job.catch(() => undefined);
  const { result, log } = await job;
  const failed = log.filter((l) => /^\s*error\b|interrupted|not parsed|no convergence|failed to converge|aborted/i.test(l));
  const gotTitle = /^Title:\s*(.*)$/m.exec(result.header)?.[1]?.trim();
  const gotPlot = /^Plotname:\s*(.*)$/m.exec(result.header)?.[1]?.trim();
  if (failed.length > 0 || gotTitle !== title || gotPlot !== plotName) {
    const why = failed.length > 0 ? failed.join(' | ') : `no ${plotName} result (got "${gotPlot}" for "${gotTitle}")`;
    throw new NgspiceError(`ngspice rejected the netlist: ${why}`, log);
  }
  return { result, log };
}

export interface NgspiceOp {
  /** Node voltages by lower-case node name (ground not listed). */
  nodes: Record<string, number>;
  /** Branch currents of voltage sources (SPICE sign: positive into the + node), by lower-case name. */
  sourceCurrents: Record<string, number>;
  log: string[];
}

/** Operating point with everything ngspice reports. */
export async function ngspiceOp(netlist: string): Promise<NgspiceOp> {
  const { result, log } = await runNgspice(netlist, '.op', 'Operating Point');
  if (result.dataType !== 'real') throw new NgspiceError('operating point came back complex', log);
  const nodes: Record<string, number> = {};
  const sourceCurrents: Record<string, number> = {};
  for (const vector of result.data) {
    const v = /^v\((.*)\)$/i.exec(vector.name);
    const i = /^i\((.*)\)$/i.exec(vector.name);
    if (v) nodes[v[1].toLowerCase()] = vector.values[0];
    else if (i) sourceCurrents[i[1].toLowerCase()] = vector.values[0];
  }
  return { nodes, sourceCurrents, log };
}

/** Node voltages at the operating point, by lower-case node name. */
export async function ngspiceOperatingPoint(netlist: string): Promise<Record<string, number>> {
  return (await ngspiceOp(netlist)).nodes;
}

export interface AcPoint {
  mag: number;
  phaseDeg: number;
  re: number;
  im: number;
}

/** Small-signal response at one frequency: every node's phasor, by lower-case node name. */
export async function ngspiceAc(netlist: string, frequencyHz: number): Promise<Record<string, AcPoint>> {
  const f = String(frequencyHz);
  const { result, log } = await runNgspice(netlist, `.ac lin 1 ${f} ${f}`, 'AC Analysis');
  if (result.dataType !== 'complex') throw new NgspiceError('AC analysis came back real', log);
  const nodes: Record<string, AcPoint> = {};
  for (const vector of result.data) {
    const v = /^v\((.*)\)$/i.exec(vector.name);
    if (!v) continue;
    const { real: re, img: im } = vector.values[0];
    nodes[v[1].toLowerCase()] = { re, im, mag: Math.hypot(re, im), phaseDeg: (Math.atan2(im, re) * 180) / Math.PI };
  }
  return nodes;
}
