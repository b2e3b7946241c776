import { resolve } from 'node:path';
import type { Command } from '../command.js';
import type { Io } from '../io.js';
import { parseOptions } from '../args.js';
import { UsageError } from '../../errors.js';
import { DEMO_BOARD_FILE, loadBoard, withSubstitutions } from '../../board/index.js';
import type { Band, BoardFigures } from '../../circuit/analysis/index.js';
import { cachedBoardFigures, cachedExpectReport } from '../../cache/expect-cache.js';
import { defaultCacheDir } from '../../cache/cache-files.js';
import { version } from '../run.js';
import { DEFAULT_METER, showReading } from '../../diagnosis/index.js';
import { formatBand, formatValue } from '../../units/index.js';
import type { Board } from '../../schemas/board.js';

const HELP = `Usage: voltwalk expect [--board FILE] [--condition NAME] [--set REF=VALUE]... [--samples N] [--seed N] [--no-cache] [--json]

The expected reading and its healthy band at every test point, under every operating condition of
the board (or the one named), computed from the board's part values with the circuit solver.

The band: nominal is a board built exactly to its part list; min–max are the worst-case limits over
every part's tolerance and every transistor, diode and op-amp spread at once; "99 % of boards" is
the 0.5–99.5 % interval of a seeded Monte Carlo run. A reading outside min–max means a fault.

  --board FILE      board file (default: the bundled demo board)
  --condition NAME  only this operating condition (its id, e.g. quiescent)
  --set REF=VALUE   compute with a part replaced, e.g. --set R7=22k (repeatable)
  --samples N       Monte Carlo boards (default 1000; 0 for worst case only)
  --seed N          Monte Carlo seed (default 1)
  --no-cache        compute anew, neither reading nor writing the copy kept from an earlier run
                    (kept in $VOLTWALK_CACHE_DIR, else $XDG_CACHE_HOME/voltwalk or ~/.cache/voltwalk)
  --json            machine-readable output: {"testPoints": [{id, node, condition, nominal, min, max, unit, mcLow, mcHigh}],
                    "figures": {...}} (an open circuit, which a meter shows as overload, is null)

Without --condition the report ends with the board's other figures, each where the board's roles
say what to work it from: what each rail supplies at rest (to set a supply's current limit by), the
detector's attack and release times (10–90 %) at both ends of their knobs, the hiss at the
makeup output at rest (rms, 20 Hz–20 kHz), each with its band, and the gain at 1 kHz from each
condition's test signal to the output. JSON: "figures": {"idleDraw":
{condition, rails: [{rail, amps}]}, "detector": {"attack"|"release": {"fastest"|"slowest":
{nominal, min, max}}} (seconds), "hiss": {testPoint, condition, nominal, min, max, dBu} (volts rms),
"gain": {testPoint, frequency, conditions: [{condition, db}]}}: the small-signal gain a tone riding
on each condition's test signal sees to the output, so that between conditions it reads as the gain
reduction at each DC level and the makeup range.

Examples:
  voltwalk expect --condition quiescent
  voltwalk expect --set R7=22k --json
`;

export const command: Command = {
  name: 'expect',
  summary: 'expected value and healthy band at every test point',
  help: HELP,
  async run(args: string[], io: Io): Promise<number> {
    const { values, positionals } = parseOptions(
      args,
      {
        board: { type: 'string' },
        condition: { type: 'string' },
        set: { type: 'string', multiple: true },
        samples: { type: 'string' },
        seed: { type: 'string' },
        'no-cache': { type: 'boolean' },
        json: { type: 'boolean' },
      },
      true,
    );
    if (positionals.length > 0) throw new UsageError(`unexpected argument "${positionals[0]}"`);
    const samples = wholeNumber(values.samples, '--samples', 1000, 0);
    const seed = wholeNumber(values.seed, '--seed', 1, -(2 ** 31));
    const substitutions = parseSets(values.set ?? []);
    const board = loadBoard(values.board !== undefined ? resolve(io.cwd, values.board) : DEMO_BOARD_FILE);
    // A whole board takes a while (one operating point per condition per sample): say how far it got,
    // on the terminal only, so piped output stays clean.
    let lastShown = 0;
    const onProgress = io.isTTY
      ? (done: number, total: number, phase: string) => {
          const now = Date.now();
          if (now - lastShown < 250 && done < total) return;
          lastShown = now;
          io.stderr(`\r${phase === 'monte-carlo' ? 'Monte Carlo' : 'worst case'}: ${done}/${total}   `);
        }
      : undefined;
    const diskCache = values['no-cache'] ? undefined : { dir: defaultCacheDir(io.env), version: version() };
    const report = cachedExpectReport(board, { condition: values.condition, substitutions, samples, seed, onProgress }, diskCache);
    if (onProgress) io.stderr('\r\x1b[K');
    // The figures beside the readings belong to the whole board, not to one condition.
    const figures = values.condition === undefined ? cachedBoardFigures(withSubstitutions(board, substitutions), diskCache) : undefined;
    if (values.json) {
      const json = { board: board.id, samples, seed, substitutions, solves: report.solves, failures: report.failures, unsolved: report.unsolved, testPoints: report.bands.map(jsonBand) };
      io.stdout(`${JSON.stringify(figures ? { ...json, figures } : json, null, 2)}\n`);
    } else {
      io.stdout(table(board, report.bands, samples, seed, substitutions));
      if (figures) io.stdout(figuresText(figures));
      for (const u of report.unsolved) io.stderr(`voltwalk: no band for ${u.testPoints.join(', ')} in ${u.condition}: the healthy board could not be solved there (${u.reason})\n`);
      if (report.failures > 0) io.stderr(`voltwalk: ${report.failures} tolerance point(s) could not be solved and were left out of the bands\n`);
    }
    return 0;
  },
};

function wholeNumber(text: string | undefined, option: string, fallback: number, min: number): number {
  if (text === undefined) return fallback;
  const n = Number(text);
  if (!/^-?\d+$/.test(text.trim()) || !Number.isSafeInteger(n) || n < min) {
    throw new UsageError(`${option} expects a whole number${min === 0 ? ' ≥ 0' : ''}, got "${text}"`);
  }
  return n;
}

function parseSets(sets: string[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const s of sets) {
    const m = /^\s*([A-Za-z]{1,3}[0-9]{1,3})\s*=\s*(\S.*?)\s*$/.exec(s);
    if (!m) throw new UsageError(`--set expects REF=VALUE such as R7=22k, got "${s}"`);
    out[m[1].toUpperCase()] = m[2];
  }
  return out;
}

/** JSON has no Infinity: an open circuit (meter overload) is null. */
const finite = (v: number | undefined) => (v === undefined ? undefined : Number.isFinite(v) ? v : null);

function jsonBand(b: Band) {
  return {
    id: b.id,
    node: b.node,
    condition: b.condition,
    nominal: finite(b.nominal),
    min: finite(b.min),
    max: finite(b.max),
    unit: b.unit,
    ...(b.mcLow !== undefined ? { mcLow: finite(b.mcLow), mcHigh: finite(b.mcHigh) } : {}),
  };
}

/** Values as the meter would show them (the same rule as the walk's screens). */
const show = (v: number, unit: 'V' | 'Ω', figures?: number) => showReading(v, unit, DEFAULT_METER, figures);

/**
 * A band's two ends with enough figures to keep them apart and lined up (11.74 V … 11.80 V, not
 * 11.7 V … 11.8 V), and its nominal to match. Open-ended bands (a resistance up to overload) keep
 * the meter's own wording for the open end.
 */
const showBand = (lo: number, hi: number, nominal: number, unit: 'V' | 'Ω') => {
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return { band: `${show(lo, unit)} … ${show(hi, unit)}`, nominal: show(nominal, unit) };
  const shown = formatBand(lo, hi, nominal, unit);
  return { band: `${shown.min} … ${shown.max}`, nominal: shown.nominal };
};

function table(board: Board, bands: Band[], samples: number, seed: number, subs: Record<string, string>): string {
  const lines: string[] = [`${board.name}: expected readings`];
  const subText = Object.entries(subs).map(([r, v]) => `${r} = ${v}`);
  if (subText.length) lines.push(`with ${subText.join(', ')}`);
  lines.push(`Band = worst case over all part tolerances${samples > 0 ? `; "99 % of boards" from ${samples} Monte Carlo boards (seed ${seed})` : ''}.`);
  const labels = new Map(board.testPoints.map((tp) => [tp.id, tp.label]));
  for (const condition of board.conditions) {
    const rows = bands.filter((b) => b.condition === condition.id);
    if (rows.length === 0) continue;
    lines.push('', `${condition.label} [${condition.id}]`);
    const cells = rows.map((b) => {
      const healthy = showBand(b.min, b.max, b.nominal, b.unit);
      return [b.id, labels.get(b.id) ?? '', healthy.nominal, healthy.band, b.mcLow !== undefined ? showBand(b.mcLow, b.mcHigh!, b.nominal, b.unit).band : ''];
    });
    const head = ['TP', 'where', 'expect', 'healthy band', samples > 0 ? '99 % of boards' : ''];
    const widths = head.map((h, i) => Math.max(h.length, ...cells.map((c) => c[i].length)));
    const row = (c: string[]) => `  ${c.map((x, i) => (i === 2 ? x.padStart(widths[i]) : x.padEnd(widths[i]))).join('  ')}`.trimEnd();
    lines.push(row(head), ...cells.map(row));
  }
  return `${lines.join('\n')}\n`;
}

/** The board's other figures, one line each, bands as the readings' bands are shown. */
function figuresText(f: BoardFigures): string {
  const rows: Array<[string, string]> = [];
  if (f.idleDraw) rows.push([`supply at rest [${f.idleDraw.condition}]`, f.idleDraw.rails.map((r) => `${r.rail} ${formatValue(r.amps, 'A')}`).join(', ')]);
  const band = (t: { nominal: number; min: number; max: number }, unit: string) => {
    const shown = formatBand(t.min, t.max, t.nominal, unit);
    return `${shown.nominal} (${shown.min} … ${shown.max})`;
  };
  if (f.detector) {
    for (const which of ['attack', 'release'] as const) {
      const { fastest, slowest } = f.detector[which];
      // A path with no knob in it has one time, whichever end is asked for.
      const one = fastest.nominal === slowest.nominal;
      rows.push([`${which} time, 10–90 %`, one ? `${band(fastest, 's')}, no knob` : `fast end ${band(fastest, 's')}, slow end ${band(slowest, 's')}`]);
    }
  }
  if (f.hiss) rows.push([`hiss at ${f.hiss.testPoint} [${f.hiss.condition}]`, `${band(f.hiss, 'V')} rms, ${f.hiss.dBu.toFixed(1)} dBu`]);
  // The gain a tone on each test level sees: between conditions, the gain reduction and the makeup range.
  for (const g of f.gain?.conditions ?? []) rows.push([`gain to ${f.gain!.testPoint} [${g.condition}]`, `${g.db.toFixed(1)} dB at ${formatValue(f.gain!.frequency, 'Hz')}, from the test signal`]);
  if (rows.length === 0) return '';
  const width = Math.max(...rows.map((r) => r[0].length));
  return `\nOther figures (worked out from the parts; bands over their tolerances)\n${rows.map(([k, v]) => `  ${k.padEnd(width)}  ${v}`).join('\n')}\n`;
}
