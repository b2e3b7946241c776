import React, { useState } from 'react';
import { Box, Text, useInput } from 'ink';
import { Frame } from '../components/frame/Frame.js';
import { Tinted } from '../theme/Tinted.js';
import { keepUnitsTogether } from '../components/prose/keep-units.js';
import { FlushLines, Prose } from '../components/prose/Prose.js';
import type { CaseSummary } from '../case/case-summary.js';
import { partLine, type PartLineInfo } from '../parts/part-info.js';
import { listFaults } from '../case/format-case-summary.js';
import { FAULT_PRESENT_NOTE } from '../../engine/fault-present-note.js';
import { TextField } from '../components/text-field/TextField.js';
import type { Check } from '../components/text-field/use-text-field.js';

interface Props {
  width: number;
  /** The terminal's height: below COMPACT_BELOW_ROWS the screen is drawn compact. */
  rows?: number;
  title: string;
  summary: CaseSummary;
  /** Location, value and colour bands of a part, by designator. */
  part: (ref: string) => PartLineInfo;
  /** Why there is no ranking, when there is none. */
  rankingNote?: string;
  isActive?: boolean;
  /**
   * Takes a reading at the suggested probe: checks what was typed (the event, or a hint) and records
   * it; returns why it was not recorded, if it was not. Absent: no probe can be taken here.
   */
  probe?: { check: (text: string) => Check<unknown>; take: (text: string) => string | undefined };
  onSummary: () => void;
  onBack: () => void;
  onNewWalk: () => void;
  onQuit: () => void;
}

const SHOWN_GROUPS = 3;
const SHOWN_PARTS = 3;
/**
 * Below this many rows the screen is drawn compact (two suspects, one place each, the tree's parts
 * on one line), so that on an 80×24 terminal the finding stays on screen above the suspects.
 */
const COMPACT_BELOW_ROWS = 32;

/** The end of a walk: what was found, the ranked suspects (groups that readings cannot split shown as one), the next probe. */
export function SuspectsScreen({ width, rows = 40, title, summary, part, rankingNote, isActive = true, probe, onSummary, onBack, onNewWalk, onQuit }: Props) {
  // Reasons are cut to one line each so three suspects fit a screen; r shows them whole, wrapped.
  const [whole, setWhole] = useState(false);
  // Typing a reading at the suggested probe; the note says why the last one was not recorded.
  const [probing, setProbing] = useState(false);
  const [note, setNote] = useState<string | undefined>();
  const canProbe = probe !== undefined && summary.next !== undefined;
  useInput(
    (input, key) => {
      if (input === 'p' && canProbe) {
        setNote(undefined);
        setProbing(true);
        return;
      }
      if (input === 'r') setWhole((w) => !w);
      if (input === 's') onSummary();
      if (input === 'n') onNewWalk();
      if (input === 'q') onQuit();
      if (key.escape) onBack();
    },
    { isActive: isActive && !probing },
  );
  const c = summary.conclusion;
  const compact = rows < COMPACT_BELOW_ROWS;
  const groupsShown = compact ? 2 : SHOWN_GROUPS;
  const placesShown = compact ? 1 : 2;
  return (
    <Frame
      title={title}
      width={width}
      hints={
        probing
          ? [{ key: 'Enter', does: 'record' }, { key: 'Esc', does: 'cancel' }]
          : [
              { key: 's', does: 'chat summary' },
              ...(canProbe ? [{ key: 'p', does: 'add reading' }] : []),
              { key: 'Esc', does: 'back' },
              { key: 'q', does: 'quit' },
              { key: 'n', does: 'new walk' },
              ...(summary.suspects.length ? [{ key: 'r', does: whole ? 'short reasons' : 'full reasons' }] : []),
            ]
      }
    >
      {c ? (
        <Box flexDirection="column">
          <Text bold>FOUND: {c.title}</Text>
          <Prose>{c.advice}</Prose>
          {/* The tree's own likely parts, with where they sit: what the person checks first. */}
          {c.parts.length > 0 && compact ? <Text wrap="truncate-end">Check first: {c.parts.join(', ')}</Text> : null}
          {c.parts.length > 0 && !compact ? <Text>Check first:</Text> : null}
          {(compact ? [] : c.parts.slice(0, SHOWN_PARTS)).map((ref) => (
            <Tinted key={ref} tone="quiet" wrap="truncate-end">
              {'  '}
              {partLine(part(ref))}
            </Tinted>
          ))}
          {!compact && c.parts.length > SHOWN_PARTS ? <Text>{`  … and ${c.parts.slice(SHOWN_PARTS).join(', ')}`}</Text> : null}
        </Box>
      ) : null}
      <Box marginTop={1} flexDirection="column">
        {summary.unexplained.length > 0 ? (
          <Box flexDirection="column" marginBottom={1}>
            {summary.unexplained.map((u) => (
              <FlushLines key={u}>
                <Tinted tone="caution">{keepUnitsTogether(`! ${u}`)}</Tinted>
              </FlushLines>
            ))}
          </Box>
        ) : null}
        {summary.suspects.length > 0 ? (
          <>
            <Prose>{`Suspects, most likely first (from your readings${c?.faultPresent ? `; ${FAULT_PRESENT_NOTE}` : ''}):`}</Prose>
            {summary.suspects.slice(0, groupsShown).map((g) => (
              <Box key={g.rank} flexDirection="column">
                <Text wrap={whole ? 'wrap' : 'truncate-end'}>
                  {String(g.rank).padStart(2)}. {`${Math.round(g.probability * 100)} %`.padStart(5)}{' '}
                  <Tinted tone="bad" bold>
                    {listFaults(g.faults, whole ? 8 : 3)}
                  </Tinted>
                  {g.faults.length > 1 ? ' (cannot tell apart yet)' : ''}
                </Text>
                {whole ? (
                  <Box marginLeft={10}>
                    <Prose>{g.why}</Prose>
                  </Box>
                ) : (
                  <Text wrap="truncate-end">{'          '}{g.why}</Text>
                )}
                {g.parts.slice(0, placesShown).map((ref) => (
                  <Tinted key={ref} tone="quiet" wrap="truncate-end">
                    {'          '}
                    {partLine(part(ref))}
                  </Tinted>
                ))}
              </Box>
            ))}
            {summary.suspects.length > groupsShown ? <Text>    … {summary.suspects.length - groupsShown} less likely (in the case summary)</Text> : null}
          </>
        ) : (
          <Text>{rankingNote ?? 'No ranking of suspects.'}</Text>
        )}
      </Box>
      {summary.next ? (
        <Box marginTop={1} flexDirection="column">
          {/* Wrapped, not cut: the probe placement is what the person needs to read whole. */}
          <Prose>{`Next probe: ${summary.next.testPoint} ${summary.next.label} under "${summary.next.conditionLabel}" — ${summary.next.probe}`}</Prose>
          {summary.next.caution ? (
            <FlushLines>
              <Tinted tone="caution">{keepUnitsTogether(`!! ${summary.next.caution}`)}</Tinted>
            </FlushLines>
          ) : null}
          {probing && probe ? (
            <TextField
              label={`Reading at ${summary.next.testPoint}:`}
              placeholder="e.g. 4.2, 420mV or 4k7"
              check={probe.check}
              onSubmit={(_value, text) => {
                setProbing(false);
                setNote(probe.take(text));
              }}
              onCancel={() => setProbing(false)}
            />
          ) : null}
          {note ? (
            <FlushLines>
              <Tinted tone="bad">{keepUnitsTogether(`! ${note}`)}</Tinted>
            </FlushLines>
          ) : null}
        </Box>
      ) : null}
    </Frame>
  );
}
