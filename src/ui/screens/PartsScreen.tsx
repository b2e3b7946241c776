import React, { useEffect, useMemo, useState } from 'react';
import { Box, Text } from 'ink';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { Frame } from '../components/frame/Frame.js';
import { StageMap } from '../components/stage-map/StageMap.js';
import { TextField } from '../components/text-field/TextField.js';
import { usePartsBrowser } from '../components/parts-browser/use-parts-browser.js';
import { Tinted } from '../theme/Tinted.js';
import { partLine } from '../parts/part-info.js';
import type { Board } from '../../schemas/board.js';
import type { ServicesModule } from '../app/App.js';
import type { Check } from '../components/text-field/use-text-field.js';
import { hintOf } from '../components/text-field/hint-of.js';

type Subs = Record<string, string | number>;

interface Props {
  width: number;
  board: Board;
  substitutions: Subs;
  services: ServicesModule;
  cwd: string;
  isActive?: boolean;
  onChange: (substitutions: Subs) => void;
  onBack: () => void;
}

const ROWS_SHOWN = 9;

/**
 * The parts by stage with value, tolerance and colour bands. A changed value is checked as it is
 * typed; every expected band of a walk started afterwards is worked out from the changed values.
 */
export function PartsScreen({ width, board, substitutions, services, cwd, isActive = true, onChange, onBack }: Props) {
  const stages = useMemo(() => {
    const staged = new Set(board.stages.flatMap((s) => s.parts));
    const rest = board.parts.filter((p) => !staged.has(p.ref)).map((p) => p.ref);
    const list = board.stages.map((s) => ({ id: s.id, label: s.label, parts: s.parts }));
    return rest.length ? [...list, { id: 'other', label: 'Other parts', parts: rest }] : list;
  }, [board]);
  const [notice, setNotice] = useState<string | undefined>();
  const [bom, setBom] = useState<typeof import('../bom/bom-csv.js') | undefined>();
  useEffect(() => {
    // The CSV reader is only needed here, so it loads when this screen opens.
    void import('../bom/bom-csv.js').then((m) => setBom(() => m));
  }, []);
  const current = services.substituted(board, substitutions);
  const [state, setMode] = usePartsBrowser({
    stages: stages.length,
    rowsIn: (s) => stages[s].parts.length,
    isActive,
    onReset: (s, r) => {
      const ref = stages[s].parts[r];
      if (ref && ref in substitutions) {
        const { [ref]: _gone, ...rest } = substitutions;
        onChange(rest);
        setNotice(`${ref} is back to the kit value`);
      }
    },
    onBack,
  });
  const stage = stages[state.stage];
  const ref = stage.parts[state.row];
  const first = Math.max(0, Math.min(state.row - Math.floor(ROWS_SHOWN / 2), stage.parts.length - ROWS_SHOWN));

  const checkValue = (text: string): Check<string> => {
    try {
      services.substituted(board, { ...substitutions, [ref]: text.trim() });
      return { ok: true, value: text.trim() };
    } catch (error) {
      return { ok: false, hint: hintOf(error) };
    }
  };
  const checkImport = (text: string): Check<{ subs: Subs; ignored: string[] }> => {
    if (!bom) return { ok: false, hint: 'the CSV reader is still loading; press Enter again' };
    const file = resolve(cwd, text.trim());
    let csv: string;
    try {
      csv = readFileSync(file, 'utf8');
    } catch {
      return { ok: false, hint: `${text.trim()}: cannot read this file (accepted: a path to a CSV bill of materials)` };
    }
    const { rows, problems } = bom.parseBomCsv(csv, text.trim());
    if (problems.length > 0) return { ok: false, hint: `${problems[0].path ? `${problems[0].path}: ` : ''}${problems[0].message}${problems.length > 1 ? ` (and ${problems.length - 1} more)` : ''}` };
    const subs: Subs = { ...substitutions };
    const ignored: string[] = [];
    for (const row of rows) {
      const part = board.parts.find((p) => p.ref === row.ref);
      if (!part || part.value === undefined) {
        ignored.push(row.ref);
        continue;
      }
      try {
        const one = services.substituted(board, { [row.ref]: row.value });
        if (services.partValueOf(one, row.ref) !== services.partValueOf(board, row.ref)) subs[row.ref] = row.value;
      } catch (error) {
        return { ok: false, hint: `line ${row.line}: ${hintOf(error)}` };
      }
    }
    return { ok: true, value: { subs, ignored } };
  };

  return (
    <Frame
      title={`Part values · ${board.name}`}
      width={width}
      hints={
        state.mode === 'browse'
          ? [{ key: '↑↓', does: 'part' }, { key: '←→', does: 'stage' }, { key: 'Enter', does: 'change value' }, { key: 'r', does: 'kit value' }, { key: 'i', does: 'import BOM CSV' }, { key: 'Esc', does: 'back' }]
          : [{ key: 'Enter', does: 'accept' }, { key: 'Esc', does: 'cancel' }]
      }
    >
      <StageMap stages={stages} currentId={stage.id} width={width} />
      <Text>
        {stage.label} ({state.stage + 1} of {stages.length})
      </Text>
      <Box flexDirection="column">
        {stage.parts.slice(first, first + ROWS_SHOWN).map((r, i) => {
          const info = services.engine.describePart(current, r);
          // A changed part says so before its location, so the mark survives a narrow terminal.
          const kit = r in substitutions ? `changed, kit ${String(board.parts.find((p) => p.ref === r)?.value)}` : undefined;
          return (
            <Text key={r} wrap="truncate-end">
              {first + i === state.row ? '> ' : '  '}
              {partLine({ ...info, where: kit ? `${kit} · ${info.where}` : info.where })}
            </Text>
          );
        })}
      </Box>
      {state.mode === 'edit' && ref ? (
        <TextField
          key={`edit-${ref}`}
          label={`New value for ${ref}:`}
          placeholder="e.g. 4k7, 100n, 2u2"
          live
          check={checkValue}
          onSubmit={(value) => {
            onChange({ ...substitutions, [ref]: value });
            setNotice(`${ref} = ${value}; expected bands are worked out from it`);
            setMode('browse');
          }}
          onCancel={() => setMode('browse')}
        />
      ) : null}
      {state.mode === 'import' ? (
        <TextField
          key="import"
          label="Bill of materials (CSV) file:"
          placeholder="e.g. bom.csv"
          check={checkImport}
          onSubmit={({ subs, ignored }) => {
            const changed = Object.keys(subs).filter((k) => !(k in substitutions)).length;
            onChange(subs);
            setNotice(`imported ${changed} changed value(s)${ignored.length ? `; ignored, no value or not on board: ${ignored.slice(0, 4).join(', ')}${ignored.length > 4 ? ', …' : ''}` : ''}`);
            setMode('browse');
          }}
          onCancel={() => setMode('browse')}
        />
      ) : null}
      {notice && state.mode === 'browse' ? <Tinted tone="good" wrap="truncate-end">{notice}</Tinted> : null}
    </Frame>
  );
}
