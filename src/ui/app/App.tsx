import React, { useCallback, useEffect, useReducer, useRef, useState } from 'react';
import { Box, Text, useApp } from 'ink';
import { writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import type * as Services from './services.js';
import { appReducer, initialAppState } from './use-app-state.js';
import { useWidth } from '../components/frame/use-width.js';
import { StartScreen, type StartChoice } from '../screens/StartScreen.js';
import { OpenBoardScreen } from '../screens/OpenBoardScreen.js';
import { PartsScreen } from '../screens/PartsScreen.js';
import { SummaryScreen } from '../screens/SummaryScreen.js';
import { WalkView, oneLine } from './WalkView.js';
import { Tinted } from '../theme/Tinted.js';
import type { Wordings } from '../walk/wording.js';

export type ServicesModule = typeof Services;

export interface AppProps {
  boardFile: string;
  /** Folder the walks autosave to. */
  folder: string;
  cwd: string;
  wording: Wordings;
  /** Loads the engine after the first frame; tests may hand it over directly. */
  loadServices: () => Promise<ServicesModule>;
  onExit?: (code: number) => void;
}

type Data = { state: 'loading' } | { state: 'ready'; data: Services.StartData } | { state: 'failed'; problem: string };

/**
 * The whole app: screens are states of one reducer; the running walk lives in the engine's actor.
 * The first frame needs nothing but ink: board, trees and engine load right after it.
 */
export function App({ boardFile, folder, cwd, wording, loadServices, onExit }: AppProps) {
  const { exit } = useApp();
  const width = useWidth();
  const [state, dispatch] = useReducer(appReducer, initialAppState(boardFile, wording));
  const [services, setServices] = useState<ServicesModule | undefined>();
  const [data, setData] = useState<Data>({ state: 'loading' });
  const [run, setRun] = useState<Services.WalkRun | undefined>();
  const [, setVersion] = useState(0);
  const [warm, setWarm] = useState<Services.WarmupState>({ state: 'working' });
  const stopWarm = useRef<(() => void) | undefined>(undefined);
  const warmId = useRef(0);
  /** Set while a walk is being opened, so a second Enter does not open a second walk. */
  const opening = useRef(false);
  useEffect(() => () => stopWarm.current?.(), []);

  const warmFor = (svc: ServicesModule, r: Services.WalkRun, substitutions: Record<string, string | number>) => {
    stopWarm.current?.();
    setWarm({ state: 'working' });
    const mine = ++warmId.current;
    stopWarm.current = svc.warmDictionary(r.board, r.boardFile, substitutions, (s) => {
      // A worker stopped because a newer walk started has nothing to say about that walk.
      if (mine !== warmId.current) return;
      setWarm(s);
      if (s.state === 'failed') dispatch({ type: 'notice', tone: 'bad', text: `ranking unavailable: ${s.problem}` });
    });
  };

  const quit = useCallback(() => {
    onExit?.(0);
    exit();
  }, [exit, onExit]);

  const reload = useCallback(
    (svc: ServicesModule, file: string) => {
      try {
        setData({ state: 'ready', data: svc.loadStartData(file, folder) });
      } catch (error) {
        setData({ state: 'failed', problem: oneLine(error) });
      }
    },
    [folder],
  );

  useEffect(() => {
    let live = true;
    // A tick's delay lets ink put the first frame on screen before the engine's modules load.
    const timer = setTimeout(() => {
      loadServices().then(
        (svc) => {
          if (!live) return;
          setServices(() => svc);
          reload(svc, state.boardFile);
        },
        (error) => live && setData({ state: 'failed', problem: oneLine(error) }),
      );
    }, 0);
    return () => {
      live = false;
      clearTimeout(timer);
    };
    // Loading happens once; a new board file reloads through `openBoard`.
  }, []);

  const send = useCallback(
    (event: Services.WalkEvent) => {
      if (!run || !services) return;
      run.actor.send(event);
      try {
        services.autosave(run);
      } catch (error) {
        dispatch({ type: 'notice', tone: 'bad', text: `${oneLine(error)} — the walk goes on, unsaved` });
      }
      setVersion((v) => v + 1);
    },
    [run, services],
  );

  const begin = (choice: StartChoice) => {
    if (!services || data.state !== 'ready') return;
    if (choice.type === 'symptom' || choice.type === 'resume') {
      if (opening.current) return;
      opening.current = true;
      // Starting a walk works out every expected reading on the board: say so before the wait.
      dispatch({ type: 'notice', tone: 'quiet', text: 'Working out the expected readings for this board…' });
      setTimeout(() => {
        try {
          open(choice);
        } finally {
          opening.current = false;
        }
      }, 20);
    } else dispatch({ type: 'show', screen: choice.type === 'parts' ? 'parts' : 'open-board' });
  };

  const open = (choice: StartChoice) => {
    if (!services || data.state !== 'ready') return;
    const { board, trees, boardFile: file } = data.data;
    try {
      if (choice.type === 'symptom') {
        const tree = trees.find((t) => t.id === choice.treeId)!;
        const r = services.startWalk(tree, board, file, state.substitutions, folder);
        r.actor.start();
        services.autosave(r);
        warmFor(services, r, state.substitutions);
        setRun(r);
        dispatch({ type: 'show', screen: 'walk' });
      } else if (choice.type === 'resume') {
        const r = services.resumeFromFile(choice.file, trees, board, file);
        r.actor.start();
        warmFor(services, r, services.contextOf(r).substitutions);
        setRun(r);
        dispatch({ type: 'show', screen: 'walk' });
      }
    } catch (error) {
      dispatch({ type: 'notice', tone: 'bad', text: oneLine(error) });
    }
  };

  const writeSummary = () => {
    if (!run || !services) return;
    const snap = run.actor.getSnapshot();
    const text = services.formatCaseSummary(services.buildCaseSummary(run.walk, { value: snap.value, context: services.contextOf(run) }, state.wording), 'md');
    const file = run.file.replace(/\.json$/, '.md');
    try {
      writeFileSync(file, text);
      dispatch({ type: 'show-summary', text, file });
    } catch (error) {
      dispatch({ type: 'show-summary', text });
      dispatch({ type: 'notice', tone: 'bad', text: `could not write ${file}: ${oneLine(error)}` });
    }
  };

  const toStart = () => {
    setRun(undefined);
    if (services) reload(services, state.boardFile);
    dispatch({ type: 'show', screen: 'start' });
  };

  const notice = state.notice ? (
    <Tinted tone={state.notice.tone} wrap="truncate-end">
      {state.notice.tone === 'bad' ? '! ' : ''}
      {state.notice.text}
    </Tinted>
  ) : null;

  let screen: React.ReactNode;
  if (state.screen === 'walk' && run && services) {
    screen = <WalkView services={services} run={run} width={width} wording={state.wording} ranking={warm.state} send={send} onSummary={writeSummary} onNewWalk={toStart} onQuit={quit} />;
  } else if (state.screen === 'summary' && state.summary) {
    screen = <SummaryScreen width={width} text={state.summary.text} file={state.summary.file} onBack={() => dispatch({ type: 'show', screen: 'walk' })} onQuit={quit} />;
  } else if (state.screen === 'open-board' && services) {
    screen = (
      <OpenBoardScreen
        width={width}
        check={(typed) => {
          const file = resolve(cwd, typed.trim());
          try {
            services.loadStartData(file, folder);
            return { ok: true, value: file };
          } catch (error) {
            return { ok: false, hint: oneLine(error) };
          }
        }}
        onOpen={(file) => {
          dispatch({ type: 'open-board', file });
          reload(services, file);
        }}
        onBack={() => dispatch({ type: 'show', screen: 'start' })}
      />
    );
  } else if (state.screen === 'parts' && services && data.state === 'ready') {
    screen = (
      <PartsScreen
        width={width}
        board={data.data.board}
        substitutions={state.substitutions}
        services={services}
        cwd={cwd}
        onChange={(substitutions) => dispatch({ type: 'replace-substitutions', substitutions })}
        onBack={() => dispatch({ type: 'show', screen: 'start' })}
      />
    );
  } else {
    const ready = data.state === 'ready' ? data.data : undefined;
    const trees = ready?.trees ?? [];
    screen = (
      <StartScreen
        width={width}
        board={ready && { name: ready.board.name, rails: ready.board.rails.map((r) => r.label), partCount: ready.board.parts.length, file: ready.boardFile }}
        status={data.state === 'loading' ? 'Loading the board and the diagnostic trees…' : data.state === 'failed' ? `! ${data.problem}` : undefined}
        symptoms={trees.map((t) => ({ treeId: t.id, symptom: t.symptom }))}
        resumable={(ready?.sessions ?? []).flatMap((s) =>
          s.status === 'unfinished'
            ? [{ file: s.file, label: `${trees.find((t) => t.id === s.session.treeId)?.symptom ?? s.session.treeId} (${Object.keys(s.session.snapshot.context.readings).length} readings, ${s.modified.toISOString().slice(0, 16).replace('T', ' ')})` }]
            : [],
        ).slice(0, 3)}
        corrupt={(ready?.sessions ?? []).flatMap((s) => (s.status === 'corrupt' ? [{ file: s.file, problem: s.problem }] : []))}
        wording={state.wording}
        onChoose={begin}
        onToggleWording={() => dispatch({ type: 'toggle-wording' })}
        onQuit={quit}
      />
    );
  }
  return (
    <Box flexDirection="column">
      {screen}
      {notice}
      {Object.keys(state.substitutions).length > 0 && state.screen === 'start' ? (
        <Text wrap="truncate-end">Changed parts: {Object.entries(state.substitutions).map(([r, v]) => `${r}=${v}`).join(', ')}</Text>
      ) : null}
    </Box>
  );
}
