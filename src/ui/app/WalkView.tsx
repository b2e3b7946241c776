import React, { useState } from 'react';
import { Text } from 'ink';
import type { WalkRun } from './services.js';
import type * as Services from './services.js';
import type { Wordings } from '../walk/wording.js';
import type { Check } from '../components/text-field/use-text-field.js';
import { StageMap } from '../components/stage-map/StageMap.js';
import { CautionScreen } from '../screens/CautionScreen.js';
import { SetupScreen } from '../screens/SetupScreen.js';
import { MeasureScreen } from '../screens/MeasureScreen.js';
import { ChoiceScreen } from '../screens/ChoiceScreen.js';
import { ReadingResultScreen, type ReadingResult } from '../screens/ReadingResultScreen.js';
import { SuspectsScreen } from '../screens/SuspectsScreen.js';
import { useHeight } from '../components/frame/use-height.js';
import { Frame } from '../components/frame/Frame.js';
import { useInput } from 'ink';
import { hintOf } from '../components/text-field/hint-of.js';

interface Props {
  services: typeof Services;
  run: WalkRun;
  width: number;
  wording: Wordings;
  /** Whether the fault dictionary the ranking needs is built yet (see dictionary-warmup.ts). */
  ranking: Services.WarmupState['state'];
  /** Sends an event to the walk; the caller saves the session before the next frame. */
  send: (event: Services.WalkEvent) => void;
  onSummary: () => void;
  onNewWalk: () => void;
  onQuit: () => void;
}

/** The walk's screens, one per kind of step, chosen from where the engine says the walk stands. */
export function WalkView({ services, run, width, wording, ranking, send, onSummary, onNewWalk, onQuit }: Props) {
  const [result, setResult] = useState<ReadingResult | undefined>();
  const rows = useHeight();
  const waiting = !result && ranking === 'working' && services.stepNeedsRanking(run);
  if (waiting) return <RankingWait width={width} title={`voltwalk · ${run.board.name} · ${run.tree.symptom}`} onBack={() => send({ type: 'user.back' })} />;
  const step = services.stepOf(run);
  const board = run.board;
  const title = `voltwalk · ${board.name} · ${run.tree.symptom}`;
  const format = (v: number, unit: string, figures?: number) => services.engine.formatValue(v, unit, figures);
  const stages = board.stages.map((s) => ({ id: s.id, label: s.label }));
  const stageId =
    (step.testPoint && board.testPoints.find((t) => t.id === step.testPoint!.id)?.stage) ??
    (step.parts?.[0] && board.stages.find((s) => s.parts.includes(step.parts![0].ref))?.id);
  const stageMap = <StageMap stages={stages} currentId={stageId} width={width} />;
  const back = () => send({ type: 'user.back' });
  const text = step.say[wording];

  if (result) {
    return <ReadingResultScreen width={width} title={title} stageMap={<StageMap stages={stages} currentId={result.stage} width={width} />} result={result} format={format} onContinue={() => setResult(undefined)} />;
  }
  switch (step.kind) {
    case 'caution':
      return (
        <CautionScreen
          key={step.node}
          width={width}
          title={title}
          text={text}
          hazards={(step.covers ?? []).map((c) => c.text)}
          expectation={step.expectation}
          onAcknowledge={() => send({ type: 'user.acknowledge' })}
          onBack={back}
        />
      );
    case 'setup':
      return (
        <SetupScreen
          key={step.node}
          width={width}
          title={title}
          stageMap={stageMap}
          text={text}
          condition={step.condition}
          powered={step.condition?.powered ?? false}
          onDone={() => send({ type: 'user.acknowledge' })}
          onBack={back}
        />
      );
    case 'measure': {
      const check = (typed: string): Check<Services.WalkEvent> => {
        try {
          return { ok: true, value: services.engine.readingEvent(step, typed) };
        } catch (error) {
          return { ok: false, hint: hintOf(error) };
        }
      };
      return (
        <MeasureScreen
          key={step.node}
          width={width}
          title={title}
          stageMap={stageMap}
          text={text}
          testPoint={step.testPoint}
          condition={step.condition}
          band={step.expected}
          check={(typed) => {
            const r = check(typed);
            return r.ok ? { ok: true, value: (r.value as { value: number }).value } : r;
          }}
          onReading={(_value, typed) => {
            const event = check(typed);
            if (!event.ok) return;
            send(event.value);
            const record = services.contextOf(run).readings[step.node];
            if (record) setResult({ testPoint: record.testPoint, label: step.testPoint?.label ?? '', value: record.value, band: record.band, outcome: record.outcome, stage: stageId, allowance: services.engine.meterAllowance(record.band) });
          }}
          onSkip={() => send({ type: 'user.skip' })}
          onBack={back}
        />
      );
    }
    case 'observe':
    case 'inspect':
      return (
        <ChoiceScreen
          key={step.node}
          width={width}
          title={title}
          stageMap={stageMap}
          heading={step.kind === 'observe' ? 'LOOK / LISTEN' : 'INSPECT'}
          text={text}
          expectation={step.expectation}
          parts={step.parts}
          choices={(step.choices ?? []).map((c) => ({ id: c.id, label: wording === 'customer' ? (c.customerLabel ?? c.label) : c.label }))}
          canSkip={step.canSkip}
          onChoose={(choice) => send({ type: 'user.answer', choice })}
          onSkip={() => send({ type: 'user.skip' })}
          onBack={back}
        />
      );
    case 'conclude': {
      const snap = run.actor.getSnapshot();
      const summary = services.buildCaseSummary(run.walk, { value: snap.value, context: services.contextOf(run) }, wording);
      return (
        <SuspectsScreen
          width={width}
          rows={rows}
          title={title}
          summary={summary}
          part={(ref) => services.engine.describePart(board, ref)}
          rankingNote={step.conclusion?.rankingNote}
          probe={
            summary.next
              ? {
                  check: (typed) => {
                    try {
                      return { ok: true, value: services.engine.probeEvent(run.walk, summary.next!.testPoint, summary.next!.condition, typed) };
                    } catch (error) {
                      return { ok: false, hint: hintOf(error) };
                    }
                  },
                  take: (typed) => {
                    const before = services.contextOf(run).extraReadings.length;
                    send(services.engine.probeEvent(run.walk, summary.next!.testPoint, summary.next!.condition, typed));
                    // The engine records a powered probe only once this walk has been through its power caution.
                    return services.contextOf(run).extraReadings.length > before
                      ? undefined
                      : 'not recorded: this probe needs the module powered, and this walk has not been through its power caution. Start a walk that powers the board first.';
                  },
                }
              : undefined
          }
          onSummary={onSummary}
          onBack={back}
          onNewWalk={onNewWalk}
          onQuit={onQuit}
        />
      );
    }
    case 'blocked':
      return <Blocked width={width} title={title} text={text} onBack={back} />;
  }
}

/** Shown while the worker builds the fault dictionary; keys still work, so the person can go back or quit. */
function RankingWait({ width, title, onBack }: { width: number; title: string; onBack: () => void }) {
  useInput((_i, key) => {
    if (key.escape) onBack();
  });
  return (
    <Frame title={title} width={width} hints={[{ key: 'Esc', does: 'back' }, { key: 'Ctrl-C', does: 'quit, saved' }]}>
      <Text>RANKING THE SUSPECTS…</Text>
      <Text>Working out how every possible fault on this board would change each reading.</Text>
      <Text>The first time on a board this takes a while; afterwards it comes from the cache.</Text>
      <Text>Your answers are saved.</Text>
    </Frame>
  );
}

function Blocked({ width, title, text, onBack }: { width: number; title: string; text: string; onBack: () => void }) {
  useInput((_i, key) => {
    if (key.escape || key.return) onBack();
  });
  return (
    <Frame title={title} width={width} hints={[{ key: 'Esc', does: 'back to the caution' }]}>
      <Text>STOPPED</Text>
      <Text>{text}</Text>
    </Frame>
  );
}

export function oneLine(error: unknown): string {
  return (error instanceof Error ? error.message : String(error)).split('\n')[0];
}
