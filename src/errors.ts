/**
 * Errors a user can cause (a bad file, a typo in a value) carry a stable code and say what was
 * found and what is accepted, so the CLI and UI can show them in one line without a stack trace.
 */
export interface Problem {
  /** Stable machine-readable code, e.g. "board.unknown-net". */
  code: string;
  /** File the problem is in, when there is one. */
  file?: string;
  /** Path inside the file, e.g. "parts[12].value". */
  path?: string;
  /** What was found, in words. */
  message: string;
  /** The accepted form. */
  accepted?: string;
}

export function formatProblem(p: Problem): string {
  const where = [p.file, p.path].filter(Boolean).join(': ');
  const head = where ? `${where}: ` : '';
  const tail = p.accepted ? ` (accepted: ${p.accepted})` : '';
  return `${head}${p.message}${tail}`;
}

/** Thrown when the user's input is wrong; the CLI exits 1 and prints each problem on its own line. */
export class UserInputError extends Error {
  readonly problems: Problem[];
  constructor(problems: Problem | Problem[]) {
    const list = Array.isArray(problems) ? problems : [problems];
    super(list.map(formatProblem).join('\n'));
    this.name = 'UserInputError';
    this.problems = list;
  }
}

/** Thrown when the command line itself is malformed; the CLI exits 2. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

/** Why a file could not be read, in the words every "cannot read FILE" message uses. */
export function whyUnreadable(error: unknown): string {
  const code = (error as NodeJS.ErrnoException | undefined)?.code;
  if (code === 'ENOENT') return 'no such file';
  if (code === 'EISDIR') return 'is a folder, not a file';
  if (code === 'EACCES' || code === 'EPERM') return 'cannot be read (permission denied)';
  return `cannot be read (${code ?? 'error'})`;
}
