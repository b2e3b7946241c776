import { resolve } from 'node:path';
import type { Command } from '../command.js';
import { parseOptions } from '../args.js';
import { UserInputError, UsageError } from '../../errors.js';
import type { Board } from '../../schemas/board.js';
import { HAZARDS } from '../../schemas/tree.js';
import { DEMO_BOARD_FILE, findCondition, findTestPoint, loadBoard, withSubstitutions } from '../../board/index.js';
import { parseReading } from '../../units/index.js';
import { DEFAULT_METER, defaultCacheDir, dictionaryReady, faultLabel, groupMembersText, rankSuspects, showReading, type RankResult, type Reading } from '../../diagnosis/index.js';
import { version } from '../run.js';
import { FAULT_PRESENT_NOTE } from '../../engine/fault-present-note.js';

const HELP = `Usage: voltwalk rank [--board FILE] [--condition NAME] --reading TP=VALUE ... [--set REF=VALUE]... [--limit N] [--no-cache] [--json]

Ranks the likely faulty parts from meter readings, using a fault dictionary computed for the board
(every modelled single fault simulated under every condition), and suggests the next probe: the one
expected to narrow the suspects most. Suspects that no test point can tell apart are shown as one group.
A reading that no modelled fault comes near (beyond 6 σ of every prediction) is named first: the
suspects are then only the nearest fits, and the probe, the meter range or the supply deserve a look.

  --board FILE        board file (default: the bundled demo board)
  --condition NAME    condition the readings were taken under (default: the board's quiescent one)
  --reading TP=VALUE  a reading, e.g. TP3=4.2, TP3=420mV, TP7=4k7, TP7=OL; repeat for more.
                      From another condition: CONDITION:TP=VALUE, e.g. unpowered:TP1=12k
  --set REF=VALUE     a part as fitted on this board, e.g. --set R7=22k (repeatable)
  --limit N           most suspects to list (default 10)
  --fault-seen        the board shows its fault (the meter stays dark, no output): leave "no fault" out,
                      its share going to the faults in proportion. Many faults read exactly as a healthy
                      board does at every test point, so readings alone cannot say this
  --no-cache          rebuild the fault dictionary instead of reusing the one kept from an earlier run
                      (kept in $VOLTWALK_CACHE_DIR, else $XDG_CACHE_HOME/voltwalk or ~/.cache/voltwalk)
  --json              machine-readable output: {"suspects": [{part, fault, probability, group, why, mode, id}],
                      "groups": [{group, probability, members (ids), labels (plain words), parts}],
                      "next": {testPoint, condition, expectedInformationBits},
                      "unexplained": [{testPoint, condition, value, nearest, text}] (only when some reading fits nothing),
                      "entropyBits"}

Examples:
  voltwalk rank --reading TP3=11.2
  voltwalk rank --reading TP3=11.2 --reading unpowered:TP1=0.4 --json
`;

export const command: Command = {
  name: 'rank',
  summary: 'rank suspect parts from readings; suggest the next probe',
  help: HELP,
  async run(args, io) {
    const { values, positionals } = parseOptions(
      args,
      {
        board: { type: 'string' },
        condition: { type: 'string' },
        reading: { type: 'string', multiple: true },
        set: { type: 'string', multiple: true },
        limit: { type: 'string' },
        json: { type: 'boolean' },
        'no-cache': { type: 'boolean' },
        'fault-seen': { type: 'boolean' },
      },
      false,
    );
    if (positionals.length > 0) throw new UsageError(`unexpected argument "${positionals[0]}"`);
    const board = loadBoard(values.board ? resolve(io.cwd, values.board) : DEMO_BOARD_FILE);
    const defaultCondition = values.condition ?? board.roles.conditions.quiescent ?? board.conditions.find((c) => c.powered)?.id ?? board.conditions[0].id;
    findCondition(board, defaultCondition);
    const substitutions = parseSettings(values.set ?? []);
    const subject = withSubstitutions(board, substitutions);
    const readings = (values.reading ?? []).map((text) => parseReadingArg(subject, text, defaultCondition));
    const limit = values.limit === undefined ? 10 : Number(values.limit);
    if (!Number.isInteger(limit) || limit < 1) {
      throw new UserInputError({ code: 'rank.limit', path: '--limit', message: `"${values.limit}" is not a count`, accepted: 'a whole number ≥ 1, e.g. 5' });
    }
    // Building the dictionary takes the solver a while on a full board: keep it for the next run.
    const diskCache = values['no-cache'] ? undefined : { dir: defaultCacheDir(io.env), version: version() };
    if (!dictionaryReady(subject, { diskCache })) {
      io.stderr(`voltwalk: simulating every modelled fault of ${subject.name} under each condition; this takes ten seconds or more the first time${diskCache ? ' and is kept for later runs' : ''}\n`);
    }
    const result = rankSuspects(subject, readings, { limit, diskCache, faultPresent: values['fault-seen'] === true });
    if (values.json) io.stdout(`${JSON.stringify(result, null, 2)}\n`);
    else io.stdout(toText(subject, readings, result, values['fault-seen'] === true));
    return 0;
  },
};

function parseSettings(list: string[]): Record<string, string> {
  const subs: Record<string, string> = {};
  for (const text of list) {
    const m = /^([A-Z]{1,3}[0-9]{1,3})=(.+)$/.exec(text.trim());
    if (!m) throw new UserInputError({ code: 'rank.bad-set', path: '--set', message: `"${text}" is not a part and a value`, accepted: 'REF=VALUE, e.g. R7=22k' });
    subs[m[1]] = m[2];
  }
  return subs;
}

const READING_FORM = 'TP=VALUE or CONDITION:TP=VALUE, e.g. TP3=4.2, TP3=420mV, unpowered:TP1=4k7, TP1=OL';

/** One --reading argument: the test point and condition checked against the board, the value as typed. */
function parseReadingArg(board: Board, text: string, defaultCondition: string): Reading {
  const m = /^(?:([a-z][a-z0-9-]*):)?(TP[0-9]{1,3})=(.+)$/i.exec(text.trim());
  if (!m) throw new UserInputError({ code: 'rank.bad-reading', path: '--reading', message: `"${text}" is not a reading`, accepted: READING_FORM });
  const condition = findCondition(board, m[1] ?? defaultCondition);
  const tp = findTestPoint(board, m[2].toUpperCase());
  const wants = condition.powered ? 'voltage' : 'resistance';
  if (tp.quantity !== wants) {
    throw new UserInputError({
      code: 'rank.wrong-condition',
      path: `--reading ${text}`,
      message: `${tp.id} is a ${tp.quantity} test point but condition "${condition.id}" is ${condition.powered ? 'powered' : 'unpowered'}`,
      accepted: `a ${tp.quantity} reading under ${tp.quantity === 'voltage' ? 'a powered' : 'an unpowered'} condition: ${board.conditions.filter((c) => c.powered === (tp.quantity === 'voltage')).map((c) => c.id).join(', ')}`,
    });
  }
  const raw = m[3].trim();
  // A meter past its top range shows OL: an open circuit is a reading, not a typo.
  if (tp.quantity === 'resistance' && /^(OL|open|inf(inity)?|∞)$/i.test(raw)) return { testPoint: tp.id, condition: condition.id, value: Infinity };
  return { testPoint: tp.id, condition: condition.id, value: parseReading(raw, tp.quantity, `--reading ${tp.id}`) };
}

function toText(board: Board, readings: Reading[], result: RankResult, faultSeen: boolean): string {
  const lines: string[] = [];
  const shown = readings.map((r) => {
    const tp = board.testPoints.find((t) => t.id === r.testPoint)!;
    // As the walk echoes a reading: four figures, so 11.77 V typed is not shown back as 11.8 V.
    return `${r.testPoint} = ${showReading(r.value, tp.quantity === 'voltage' ? 'V' : 'Ω', DEFAULT_METER, 4)} (${r.condition})`;
  });
  lines.push(`${board.name}: ${shown.length ? `readings ${shown.join(', ')}` : 'no readings yet — suspects by prior likelihood only'}`);
  lines.push('');
  for (const u of result.unexplained ?? []) lines.push(`! ${u.text}`, '');
  lines.push(faultSeen ? `Suspects, most likely first (${FAULT_PRESENT_NOTE}):` : 'Suspects, most likely first:');
  const width = Math.max(...result.suspects.map((s) => faultLabel(s).length), 10);
  result.suspects.forEach((s, i) => {
    lines.push(`  ${String(i + 1).padStart(2)}. ${faultLabel(s).padEnd(width)}  ${percent(s.probability).padStart(6)}  group ${s.group}`);
    lines.push(`      why: ${s.why}`);
  });
  const shared = result.groups.filter((g) => g.members.length > 1);
  if (shared.length) {
    lines.push('');
    lines.push('Groups no test point can split (fix or inspect together):');
    for (const g of shared) lines.push(`  group ${g.group} (${percent(g.probability)}): ${groupMembersText(g.labels)}`);
  }
  lines.push('');
  if (result.next) {
    const tp = board.testPoints.find((t) => t.id === result.next!.testPoint)!;
    const condition = board.conditions.find((c) => c.id === result.next!.condition)!;
    if (condition.powered) {
      lines.push('Caution before this powered measurement:');
      for (const h of ['mains-supply', 'rails', 'hot-parts'] as const) lines.push(`  - ${HAZARDS[h]}`);
    }
    lines.push(`Next probe: ${tp.id} (${tp.label}) under "${condition.label}" — ${tp.probe}; expected to tell ${result.next.expectedInformationBits.toFixed(2)} bits.`);
    if (!readings.some((r) => r.condition === condition.id)) lines.push(`  Set-up: ${condition.instructions}`);
  } else {
    lines.push('No further probe can narrow these suspects: inspect or replace the parts of the top group.');
  }
  return `${lines.join('\n')}\n`;
}

const percent = (p: number) => `${(p * 100).toFixed(p >= 0.1 ? 0 : 1)} %`;
