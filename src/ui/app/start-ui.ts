import { createElement } from 'react';
import { render } from 'ink';
import { App } from './App.js';
import { ColourContext } from '../theme/colour-context.js';
import type { Wordings } from '../walk/wording.js';

export interface UiOptions {
  boardFile: string;
  folder: string;
  cwd: string;
  wording: Wordings;
  colour: boolean;
}

/**
 * Draws the app and waits for it to end. Its imports are ink, react and the app's own screens:
 * the engine, solver and ranking load after the first frame (see services.ts).
 */
export async function startUi(options: UiOptions): Promise<number> {
  let code = 0;
  const instance = render(
    createElement(
      ColourContext.Provider,
      { value: options.colour },
      createElement(App, {
        boardFile: options.boardFile,
        folder: options.folder,
        cwd: options.cwd,
        wording: options.wording,
        loadServices: () => import('./services.js'),
        onExit: (c: number) => {
          code = c;
        },
      }),
    ),
    { exitOnCtrlC: true },
  );
  await instance.waitUntilExit();
  // The last frame ends where its hint line ends; the shell's prompt belongs on a line of its own.
  process.stdout.write('\n');
  return code;
}
