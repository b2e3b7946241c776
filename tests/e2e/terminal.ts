import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

/**
 * Runs the real `voltwalk` binary in a detached tmux window of 80×24 on a private tmux server, so
 * tests see exactly what a person's terminal would show and can type into it.
 */
export const ROOT = fileURLToPath(new URL('../..', import.meta.url));

export function hasTmux(): boolean {
  return !spawnSync('tmux', ['-V']).error;
}

export class Terminal {
  private readonly socket = `voltwalk-e2e-${process.pid}-${Math.random().toString(36).slice(2, 8)}`;

  constructor(command: string, env: Record<string, string>, cwd: string) {
    const exports = Object.entries(env)
      .map(([k, v]) => `${k}=${JSON.stringify(v)}`)
      .join(' ');
    // The shell reports the exit code on screen, then keeps the window open for the test to read it.
    const script = `cd ${JSON.stringify(cwd)} && env ${exports} ${command}; echo "EXIT:$?"; sleep 300`;
    this.tmux('new-session', '-d', '-x', '80', '-y', '24', '-s', 'e2e', script);
  }

  private tmux(...args: string[]): string {
    const r = spawnSync('tmux', ['-L', this.socket, ...args], { encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`tmux ${args[0]} failed: ${r.stderr}`);
    return r.stdout;
  }

  screen(): string {
    return this.tmux('capture-pane', '-p', '-t', 'e2e');
  }

  /** Literal text, as typed. */
  type(text: string): void {
    this.tmux('send-keys', '-t', 'e2e', '-l', '--', text);
  }

  /** Named keys: Enter, Down, Escape, C-c. */
  keys(...names: string[]): void {
    for (const n of names) this.tmux('send-keys', '-t', 'e2e', n);
  }

  async waitFor(test: (screen: string) => boolean, what: string, timeoutMs = 60_000): Promise<string> {
    const t0 = Date.now();
    let last = '';
    while (Date.now() - t0 < timeoutMs) {
      last = this.screen();
      if (test(last)) return last;
      await new Promise((r) => setTimeout(r, 150));
    }
    throw new Error(`timed out waiting for ${what}; the screen shows:\n${last}`);
  }

  /** Waits until the screen differs from `before` and has stopped changing for a moment. */
  async waitForChange(before: string, timeoutMs = 60_000): Promise<string> {
    let now = await this.waitFor((s) => s !== before, 'the screen to change', timeoutMs);
    for (;;) {
      await new Promise((r) => setTimeout(r, 300));
      const again = this.screen();
      if (again === now) return now;
      now = again;
    }
  }

  close(): void {
    try {
      this.tmux('kill-server');
    } catch {
      // already gone
    }
  }
}
