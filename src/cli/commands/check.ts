import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import type { Command } from '../command.js';
import { parseOptions } from '../args.js';
import { UsageError, UserInputError, formatProblem, whyUnreadable, type Problem } from '../../errors.js';
import { checkBoardFile } from '../../board/validate.js';
import { parseJson } from '../../board/parse-json.js';
import { BOARD_FORMAT } from '../../schemas/board.js';

const TREE_FORMAT = 'voltwalk-tree/1';

const HELP = `Usage: voltwalk check FILE... [--json]

Validates board files ("format": "${BOARD_FORMAT}") and diagnostic tree files
("format": "${TREE_FORMAT}"): shape first, then meaning (unknown nets and parts, pins that do not fit a
part, values a part cannot have, roles mapped to missing ids). Every problem is listed on its own line
with the file, the path inside it and the accepted form.

Exit status: 0 when every file is valid, 1 when any is not, 2 for a usage mistake.

  FILE      one or more board or tree files; a folder stands for every .json file in it and
            in its subfolders (e.g. voltwalk check trees)
  --json    machine-readable output: {"ok": bool, "files": [{"file", "kind", "ok", "summary", "problems"}]}

Examples:
  voltwalk check trees/boards/*.json
  voltwalk check my-board.json --json
`;

type Kind = 'board' | 'tree' | 'unknown';

interface FileReport {
  file: string;
  kind: Kind;
  ok: boolean;
  summary: string;
  problems: Problem[];
}

async function checkOne(file: string): Promise<FileReport> {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch {
    // checkBoardFile words the read failure the same way for every kind.
    const problems = checkBoardFile(file).problems.map((p) => ({ ...p, code: p.code.replace(/^board\./, 'file.') }));
    return { file, kind: 'unknown', ok: false, summary: '', problems };
  }
  const { value, problem } = parseJson(text, file, 'file');
  if (problem) return { file, kind: 'unknown', ok: false, summary: '', problems: [problem] };
  const format = value && typeof value === 'object' && !Array.isArray(value) ? (value as { format?: unknown }).format : undefined;
  if (typeof format === 'string' && format.startsWith('voltwalk-tree')) {
    // The tree engine is loaded only when a tree is checked: a board check does not pay for it.
    const { checkTreeFile } = await import('../../engine/check-tree-file.js');
    const problems = checkTreeFile(file);
    return { file, kind: 'tree', ok: problems.length === 0, summary: 'diagnostic tree', problems };
  }
  const looksLikeBoard = (typeof format === 'string' && format.startsWith('voltwalk-board')) || (format === undefined && value !== null && typeof value === 'object' && 'parts' in value);
  if (!looksLikeBoard) {
    return {
      file,
      kind: 'unknown',
      ok: false,
      summary: '',
      problems: [
        {
          code: 'file.unknown-format',
          file,
          path: 'format',
          message: format === undefined ? 'no "format" key: cannot tell a board from a tree' : `unknown format ${JSON.stringify(format)}`,
          accepted: `"format": "${BOARD_FORMAT}" or "format": "${TREE_FORMAT}"`,
        },
      ],
    };
  }
  const { board, problems } = checkBoardFile(file);
  const summary = board
    ? `board ${board.id}: ${board.parts.length} parts, ${board.testPoints.length} test points, ${board.conditions.length} conditions`
    : 'board';
  return { file, kind: 'board', ok: problems.length === 0, summary, problems };
}

export const command: Command = {
  name: 'check',
  summary: 'validate a board or tree file and list every problem',
  help: HELP,
  async run(args, io) {
    const { values, positionals } = parseOptions(args, { json: { type: 'boolean' } });
    if (positionals.length === 0) throw new UsageError('check needs at least one FILE');
    const files = positionals.flatMap((f) => expandFolder(f, io.cwd));
    const reports: FileReport[] = [];
    for (const f of files) reports.push(await checkOne(resolve(io.cwd, f)));
    // Name files as the user typed them (a folder's files by the folder's name as typed).
    reports.forEach((r, i) => {
      r.file = files[i];
      r.problems = r.problems.map((p) => ({ ...p, file: files[i] }));
    });
    const ok = reports.every((r) => r.ok);
    if (values.json) {
      io.stdout(`${JSON.stringify({ ok, files: reports }, null, 2)}\n`);
      return ok ? 0 : 1;
    }
    for (const r of reports) {
      if (r.ok) io.stdout(`ok  ${r.file}  (${r.summary})\n`);
      else for (const p of r.problems) io.stdout(`${formatProblem(p)}\n`);
    }
    if (!ok) {
      const count = reports.reduce((n, r) => n + r.problems.length, 0);
      const bad = reports.filter((r) => !r.ok).length;
      io.stderr(`voltwalk check: ${count} problem${count === 1 ? '' : 's'} in ${bad} of ${reports.length} file${reports.length === 1 ? '' : 's'}\n`);
    }
    return ok ? 0 : 1;
  },
};

/**
 * A folder as the .json files in it and its subfolders, sorted, named under the folder as typed;
 * anything else as given (a missing file is reported by checkOne). An empty folder stays itself,
 * so it is reported rather than silently checking nothing.
 */
function expandFolder(typed: string, cwd: string): string[] {
  let isFolder = false;
  try {
    isFolder = statSync(resolve(cwd, typed)).isDirectory();
  } catch {
    return [typed];
  }
  if (!isFolder) return [typed];
  let names: string[];
  try {
    names = readdirSync(resolve(cwd, typed), { recursive: true, encoding: 'utf8' }) as string[];
  } catch (error) {
    throw new UserInputError({ code: 'check.folder', file: typed, message: `folder ${whyUnreadable(error)}`, accepted: 'a readable folder of board or tree files' });
  }
  const found = names
    .filter((name) => name.endsWith('.json'))
    .sort()
    .map((name) => join(typed, name));
  return found.length ? found : [typed];
}
