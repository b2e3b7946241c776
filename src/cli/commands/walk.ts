import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import type { Command } from '../command.js';
import { parseOptions } from '../args.js';
import { UsageError, UserInputError, whyUnreadable } from '../../errors.js';
import { DEMO_BOARD_FILE, loadBoard } from '../../board/index.js';
import { defaultCacheDir } from '../../diagnosis/index.js';
import { version } from '../run.js';
import { findTree, jsonNumbers, formatTranscriptMarkdown, formatTranscriptText, loadTree, walkFromAnswers, type Answers } from '../../engine/index.js';

const HELP = `Usage: voltwalk walk --tree NAME --answers FILE [--board FILE] [--set REF=VALUE]... [--json|--md] [--customer] [--oscilloscope] [--samples N] [--no-ranking] [--no-cache]

Replays a diagnostic tree without the terminal UI. Each step's expected band is computed from the
board's part values (after any --set); the transcript shows each step, the band, the reading and
the outcome, then the conclusion with the ranked suspects.

  --tree NAME       a tree id (see \`voltwalk trees\`) or a tree file
  --answers FILE    JSON object keyed by step id:
                      measure steps: the reading as typed, e.g. "11.9 V", "-11,8", "4k7";
                        a hiss level as the interface shows it, e.g. "-65.5 dBu", "411uV"
                      observe steps: a choice id, e.g. "yes"
                      inspect steps: "ok" or "fault"
                      caution and setup steps: true (acknowledged)
                      any step that may be skipped: "skip"
  --board FILE      a board file (default: the bundled demo board)
  --set REF=VALUE   a part changed on the board, e.g. --set R22=220k (repeatable)
  --json            the transcript as JSON
  --md              the transcript as Markdown (for a support chat or a case note)
  --customer        prompts in customer wording
  --oscilloscope    the person has an oscilloscope (otherwise scope steps take their multimeter route)
  --samples N       Monte Carlo boards per band (default 1000; 0 = worst case only, faster)
  --no-ranking      leave out the ranked suspects at the conclusion (faster: no fault dictionary)
  --no-cache        rank from a fault dictionary solved now, not the board's one kept by an earlier
                    \`voltwalk rank\` or terminal walk

When a step has no answer, or an answer is wrong for its step (a typo in a reading, an unknown
choice), the partial transcript is printed up to that step, the problem goes to stderr on one line
naming the step, and the exit code is 1. A walk that reaches a conclusion exits 0.

Examples:
  voltwalk walk --tree no-gain-reduction --answers answers.json
  voltwalk walk --tree first-power-up --answers a.json --set R22=220k --md
  voltwalk walk --tree noisy-makeup --answers examples/noisy-makeup-hiss.json
`;

function readAnswers(file: string): Answers {
  const accepted = 'a JSON object keyed by step id, e.g. {"rail-pos": "11.9 V"}';
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    throw new UserInputError({ code: 'answers.unreadable', file, message: `answers file: ${whyUnreadable(error)}`, accepted });
  }
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    throw new UserInputError({ code: 'answers.unreadable', file, message: 'the answers file is not valid JSON', accepted });
  }
  if (!raw || typeof raw !== 'object' || Array.isArray(raw)) {
    throw new UserInputError({ code: 'answers.shape', file, message: 'the answers file is not a JSON object', accepted: 'a JSON object keyed by step id' });
  }
  for (const [key, value] of Object.entries(raw)) {
    if (!['string', 'number', 'boolean'].includes(typeof value)) {
      throw new UserInputError({ code: 'answers.shape', file, path: key, message: `answer for "${key}" is ${Array.isArray(value) ? 'a list' : typeof value}`, accepted: 'a reading or choice as text, a number, or true' });
    }
  }
  return raw as Answers;
}

function parseSets(list: string[]): Record<string, string> {
  const sets: Record<string, string> = {};
  for (const item of list) {
    const m = /^([A-Za-z]{1,3}[0-9]{1,3})=(.+)$/.exec(item.trim());
    if (!m) throw new UsageError(`--set "${item}" is not REF=VALUE (e.g. --set R22=220k)`);
    sets[m[1].toUpperCase()] = m[2];
  }
  return sets;
}

export const command: Command = {
  name: 'walk',
  summary: 'replay a diagnostic tree from an answers file',
  help: HELP,
  async run(args, io) {
    const { values } = parseOptions(
      args,
      {
        tree: { type: 'string' },
        answers: { type: 'string' },
        board: { type: 'string' },
        set: { type: 'string', multiple: true },
        json: { type: 'boolean' },
        md: { type: 'boolean' },
        customer: { type: 'boolean' },
        oscilloscope: { type: 'boolean' },
        samples: { type: 'string' },
        'no-ranking': { type: 'boolean' },
        'no-cache': { type: 'boolean' },
      },
      false,
    );
    if (!values.tree) throw new UsageError('--tree NAME is required');
    if (!values.answers) throw new UsageError('--answers FILE is required');
    if (values.json && values.md) throw new UsageError('choose one of --json and --md');
    let samples: number | undefined;
    if (values.samples !== undefined) {
      samples = Number(values.samples);
      if (!Number.isInteger(samples) || samples < 0) throw new UsageError(`--samples "${values.samples}" is not a whole number ≥ 0`);
    }
    const board = loadBoard(values.board ? resolve(io.cwd, values.board) : DEMO_BOARD_FILE);
    const tree = values.tree.endsWith('.json') ? loadTree(resolve(io.cwd, values.tree)) : findTree(values.tree);
    const answers = readAnswers(resolve(io.cwd, values.answers));
    const transcript = walkFromAnswers(tree, board, answers, { set: parseSets(values.set ?? []), oscilloscope: values.oscilloscope ?? false, samples, ranking: !values['no-ranking'], diskCache: values['no-cache'] ? undefined : { dir: defaultCacheDir(io.env), version: version() } });
    const wording = values.customer ? 'customer' : 'technician';
    if (values.json) io.stdout(`${JSON.stringify(transcript, jsonNumbers, 2)}\n`);
    else if (values.md) io.stdout(formatTranscriptMarkdown(transcript, wording));
    else io.stdout(formatTranscriptText(transcript, wording));
    if (transcript.stopped) {
      // The partial transcript is on stdout; the one line that says what is needed goes to stderr.
      const p = transcript.stopped.problem;
      if (values.json) io.stderr(`${JSON.stringify({ errors: [p] })}\n`);
      else io.stderr(`voltwalk: ${p.path ? `${p.path}: ` : ''}${p.message}${p.accepted ? ` (accepted: ${p.accepted})` : ''}\n`);
      return 1;
    }
    return 0;
  },
};
