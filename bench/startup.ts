/**
 * Start-up: time from launching `node dist/cli/bin.js` (no arguments: the terminal UI on the demo
 * board) to its first frame, against a bare ink app that renders one line, both under a
 * pseudo-terminal (`script`) so ink draws as it would for a person. Also the time until the start
 * screen lists the symptoms (board and trees loaded). Medians of RUNS runs; run `npm run build` first.
 */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, writeFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { fmt, median } from './timing.js';

const RUNS = 10;
const ROOT = fileURLToPath(new URL('..', import.meta.url));
const BIN = join(ROOT, 'dist', 'cli', 'bin.js');

/** Milliseconds from spawn until each marker first appears on the terminal; the process is then stopped. */
function timeMarkers(command: string, markers: string[], cwd: string, timeoutMs = 30_000): Promise<Record<string, number>> {
  return new Promise((resolve, reject) => {
    const t0 = performance.now();
    const child = spawn('script', ['-qfc', command, '/dev/null'], { cwd, detached: true, env: { ...process.env, COLUMNS: '80', LINES: '24' }, stdio: ['pipe', 'pipe', 'ignore'] });
    let seen = '';
    const times: Record<string, number> = {};
    const stop = () => {
      clearTimeout(timer);
      try {
        process.kill(-child.pid!, 'SIGKILL');
      } catch {
        // already gone
      }
    };
    const timer = setTimeout(() => {
      stop();
      reject(new Error(`no ${markers.filter((m) => !(m in times)).join(', ')} within ${timeoutMs} ms from: ${command}`));
    }, timeoutMs);
    child.stdout.on('data', (chunk: Buffer) => {
      seen += chunk.toString('utf8');
      const now = performance.now() - t0;
      for (const m of markers) if (!(m in times) && seen.includes(m)) times[m] = now;
      if (markers.every((m) => m in times)) {
        stop();
        resolve(times);
      }
    });
    child.on('error', (e) => {
      stop();
      reject(e);
    });
  });
}

export async function run(): Promise<void> {
  if (spawnSync('script', ['--version']).error) {
    console.log('skipped: `script` (util-linux) is not installed, so there is no pseudo-terminal to time a first frame in');
    return;
  }
  if (!existsSync(BIN)) {
    console.log('skipped: dist/cli/bin.js is missing — run `npm run build` first');
    return;
  }
  const dir = mkdtempSync(join(tmpdir(), 'voltwalk-startup-'));
  try {
    const ink = import.meta.resolve('ink');
    const react = import.meta.resolve('react');
    const hello = join(dir, 'hello.mjs');
    writeFileSync(
      hello,
      `import { render, Text } from ${JSON.stringify(ink)};\nimport React from ${JSON.stringify(react)};\nrender(React.createElement(Text, null, 'hello from ink'));\nsetTimeout(() => {}, 60000);\n`,
    );
    const bare: number[] = [];
    const first: number[] = [];
    const ready: number[] = [];
    // Sessions go to a scratch folder so the bench neither reads nor leaves any in the checkout.
    const voltwalk = `VOLTWALK_HOME=${JSON.stringify(join(dir, 'sessions'))} node ${JSON.stringify(BIN)}`;
    for (let i = 0; i < RUNS + 1; i++) {
      const b = await timeMarkers(`node ${JSON.stringify(hello)}`, ['hello from ink'], dir);
      const v = await timeMarkers(voltwalk, ['guided fault-finding', 'What is wrong'], dir);
      if (i === 0) continue; // the first pair warms the file cache
      bare.push(b['hello from ink']);
      first.push(v['guided fault-finding']);
      ready.push(v['What is wrong']);
    }
    const mb = median(bare);
    const mf = median(first);
    const mr = median(ready);
    console.log(`bare ink hello, first frame        ${fmt(mb)}  (median of ${RUNS})`);
    console.log(`voltwalk, first frame              ${fmt(mf)}  ratio ${(mf / mb).toFixed(2)}× (aim ≤ 1.3×)`);
    console.log(`voltwalk, symptoms on screen       ${fmt(mr)}  ratio ${(mr / mb).toFixed(2)}×`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
