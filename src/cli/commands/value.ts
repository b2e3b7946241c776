import type { Command } from '../command.js';
import { parseOptions } from '../args.js';
import { UsageError } from '../../errors.js';
import {
  SERIES_NAMES,
  bandsFor,
  decodeBands,
  formatValue,
  isPreferred,
  nearestPreferred,
  parseValue,
  toColour,
  type UnitSymbol,
} from '../../units/index.js';

const HELP = `Usage: voltwalk value TEXT [--json]

Parses a part value (IEC 60062 letter code or engineering notation) or a resistor's colour bands,
and prints the value, its nearest IEC 60063 preferred values, and the bands a person should see.

  TEXT      a value such as 4k7, 4.7k, 100nF, 2R2, 4k7J, 4,7k — or colour bands, first band first,
            such as "yellow violet red gold"
  --json    machine-readable output

Examples:
  voltwalk value 4k7
  voltwalk value yellow violet red gold
  voltwalk value 2u2F --json
`;

interface ValueReport {
  input: string;
  value: number;
  unit: string | null;
  text: string;
  tolerance: number | null;
  source: 'text' | 'bands';
  preferred: Record<string, { nearest: number; below: number; above: number; isPreferred: boolean }>;
  bands: string[] | null;
}

function report(input: string, words: string[]): ValueReport {
  const looksLikeBands = words.length >= 3 && words.every((w) => toColour(w) !== undefined);
  let value: number;
  let unit: UnitSymbol | undefined;
  let tolerance: number | undefined;
  if (looksLikeBands) {
    const decoded = decodeBands(words);
    value = decoded.value;
    unit = 'Ω';
    tolerance = decoded.tolerance;
  } else {
    ({ value, unit, tolerance } = parseValue(input, { field: 'TEXT' }));
  }
  const preferred: ValueReport['preferred'] = {};
  if (value > 0) {
    for (const name of SERIES_NAMES) {
      const n = nearestPreferred(value, name);
      preferred[name] = { nearest: n.value, below: n.below, above: n.above, isPreferred: isPreferred(value, name) };
    }
  }
  // Colour bands only mean something for resistors: an explicit non-ohm unit has none.
  const showBands = value > 0 && (unit === undefined || unit === 'Ω');
  const bands = showBands ? bandsFor(value, tolerance ?? 0.05) : [];
  return {
    input,
    value,
    unit: unit ?? null,
    text: formatValue(value, unit ?? ''),
    tolerance: tolerance ?? null,
    source: looksLikeBands ? 'bands' : 'text',
    preferred,
    bands: bands.length > 0 ? bands : null,
  };
}

function toText(r: ValueReport): string {
  const lines = [`${r.text}${r.tolerance !== null ? ` ±${+(r.tolerance * 100).toPrecision(3)} %` : ''}  (${r.value})`];
  for (const [name, p] of Object.entries(r.preferred)) {
    const unit = r.unit ?? '';
    const status = p.isPreferred ? 'preferred' : `nearest ${formatValue(p.nearest, unit)} (between ${formatValue(p.below, unit)} and ${formatValue(p.above, unit)})`;
    lines.push(`  ${name.padEnd(4)} ${status}`);
  }
  if (r.bands) lines.push(`  bands ${r.bands.join(' ')}`);
  else if (r.unit === null || r.unit === 'Ω') lines.push('  bands none (value cannot be colour-coded)');
  return `${lines.join('\n')}\n`;
}

export const command: Command = {
  name: 'value',
  summary: 'parse a part value or colour bands',
  help: HELP,
  async run(args, io) {
    const { values, positionals } = parseOptions(args, { json: { type: 'boolean' } });
    if (positionals.length === 0) throw new UsageError('value needs TEXT, e.g. voltwalk value 4k7');
    const r = report(positionals.join(' '), positionals);
    io.stdout(values.json ? `${JSON.stringify(r, null, 2)}\n` : toText(r));
    return 0;
  },
};
