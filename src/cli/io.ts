/** What a command may touch of the outside world, so tests can run commands without a process. */
export interface Io {
  stdout: (text: string) => void;
  stderr: (text: string) => void;
  /** Whether stdout is an interactive terminal (frames and colour allowed). */
  isTTY: boolean;
  env: Record<string, string | undefined>;
  cwd: string;
}

export function processIo(): Io {
  return {
    stdout: (text) => process.stdout.write(text),
    stderr: (text) => process.stderr.write(text),
    isTTY: Boolean(process.stdout.isTTY),
    env: process.env,
    cwd: process.cwd(),
  };
}

/** Colour only on a terminal, and never with NO_COLOR (any value) or TERM=dumb. */
export function colourAllowed(io: Io): boolean {
  if (io.env.NO_COLOR !== undefined) return false;
  if (io.env.TERM === 'dumb') return false;
  return io.isTTY;
}

/** A recording Io for tests. */
export function memoryIo(overrides: Partial<Io> = {}): Io & { out: () => string; err: () => string } {
  let out = '';
  let err = '';
  return {
    stdout: (t) => {
      out += t;
    },
    stderr: (t) => {
      err += t;
    },
    isTTY: false,
    env: {},
    cwd: process.cwd(),
    ...overrides,
    out: () => out,
    err: () => err,
  };
}
