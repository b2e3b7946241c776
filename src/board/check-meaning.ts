import type { Board, Part } from '../schemas/board.js';
import { CONDITION_ROLE_POWERED, TEST_POINT_ROLE_QUANTITY } from '../schemas/roles.js';
import { UserInputError, type Problem } from '../errors.js';
import { formatValue } from '../units/index.js';
import { FIXED_PINS, acceptedPinsText, requiredPins } from './pins.js';
import { BUILTIN_MODELS, BUILTIN_OPAMP_MODELS, MODEL_TYPE, VALUE_RANGE } from './defaults.js';
import { modelNameFor, parsePartValue } from './values.js';
import { didYouMean } from './shape-problems.js';
import { DIODE_PARAMS } from '../circuit/devices/diode.js';
import { BJT_PARAMS } from '../circuit/devices/bjt.js';

/**
 * Meaning checks on a board that already has the right shape. Every problem is collected, none stops
 * the others, so one `voltwalk check` run lists them all.
 *
 * Net rule: a net must be touched by at least one part pin. A net touched by exactly one pin is
 * dangling (a typo in a net name, usually) unless the board names it deliberately as a rail's net,
 * a test point's net or reference, a condition's signal net or the ground net: those are places
 * something outside the parts (a supply, a probe, a signal source) connects to.
 */

// Names a netlist can carry; a leading "_" is kept for nodes voltwalk adds itself (meter, signal source).
const NET_NAME = /^[A-Za-z0-9+\-][A-Za-z0-9_+\-./]*$/;
const VALUED_KINDS = new Set(Object.keys(VALUE_RANGE));
const OPAMP_KINDS = new Set(['opamp-dual', 'opamp-quad']);

export function meaningProblems(board: Board, file: string): Problem[] {
  const problems: Problem[] = [];
  const add = (code: string, path: string, message: string, accepted?: string) =>
    problems.push({ code: `board.${code}`, file, path, message, accepted });

  const refs = new Map<string, Part>();
  const partList = board.parts.map((p) => p.ref);
  const someRefs = (list: string[]) => `a designator on this board, e.g. ${list.slice(0, 4).join(', ')}`;

  duplicates(board.parts.map((p) => p.ref), 'parts', 'ref', 'designator', add);
  duplicates(board.testPoints.map((t) => t.id), 'testPoints', 'id', 'test point id', add);
  duplicates(board.conditions.map((c) => c.id), 'conditions', 'id', 'condition id', add);
  duplicates(board.stages.map((s) => s.id), 'stages', 'id', 'stage id', add);
  duplicates(board.rails.map((r) => r.id), 'rails', 'id', 'rail id', add);
  for (const p of board.parts) if (!refs.has(p.ref)) refs.set(p.ref, p);

  // Nets: who touches each one, and who names it from outside the parts.
  const touches = new Map<string, string[]>();
  const named = new Map<string, string>();
  const nameNet = (net: string, path: string) => {
    if (!named.has(net)) named.set(net, path);
  };
  nameNet(board.ground, 'ground');
  board.rails.forEach((r, i) => nameNet(r.net, `rails[${i}].net`));
  board.testPoints.forEach((t, i) => {
    nameNet(t.net, `testPoints[${i}].net`);
    if (t.refNet !== undefined) nameNet(t.refNet, `testPoints[${i}].refNet`);
  });
  board.conditions.forEach((c, i) => c.signal && nameNet(c.signal.net, `conditions[${i}].signal.net`));

  board.parts.forEach((part, i) => {
    const at = `parts[${i}]`;
    checkPins(part, at, add);
    for (const [pin, net] of Object.entries(part.pins)) {
      const list = touches.get(net) ?? [];
      list.push(`${part.ref}.${pin}`);
      touches.set(net, list);
    }
    checkValue(part, at, add);
    checkModel(board, part, at, add);
    checkControls(part, at, add);
    (part.neighbours ?? []).forEach(([a, b], j) => {
      for (const pin of [a, b]) {
        if (!(pin in part.pins)) add('unknown-pin', `${at}.neighbours[${j}]`, `${part.ref} has no pin "${pin}"`, `pins of ${part.ref}: ${Object.keys(part.pins).join(', ')}`);
      }
    });
  });

  const allNets = [...new Set([...touches.keys(), ...named.keys()])];
  const lower = new Map<string, string>();
  for (const net of allNets) {
    const where = named.get(net) ?? pinPath(board, net);
    if (!NET_NAME.test(net)) {
      add('net-name', where, `net name "${net}" has characters a netlist cannot carry`, 'letters, digits and + - _ . / (no spaces), not starting with _');
    }
    if (net === '0' && net !== board.ground) add('net-name', where, 'net "0" is the simulator ground but the board\'s ground is another net', `name the ground net "0" in "ground", or rename this net`);
    const key = net.toLowerCase();
    const other = lower.get(key);
    if (other !== undefined && other !== net) add('net-case', where, `nets "${other}" and "${net}" differ only in letter case`, 'one spelling per net');
    else lower.set(key, net);
  }
  for (const [net, path] of named) {
    if (!touches.has(net)) {
      add('unknown-net', path, `net "${net}" is touched by no part pin${didYouMean(net, [...touches.keys()])}`, 'a net some part pin is on');
    }
  }
  for (const [net, pins] of touches) {
    if (pins.length === 1 && !named.has(net)) {
      add(
        'dangling-net',
        pinPath(board, net),
        `net "${net}" reaches only ${pins[0]}${didYouMean(net, [...touches.keys()].filter((n) => n !== net))}`,
        'a net joining two or more pins, or one named by a rail, test point, signal or the ground',
      );
    }
  }

  // Stages and test points.
  const stageIds = board.stages.map((s) => s.id);
  board.stages.forEach((s, i) =>
    s.parts.forEach((ref, j) => {
      if (!refs.has(ref)) add('unknown-part', `stages[${i}].parts[${j}]`, `no part "${ref}"${didYouMean(ref, partList)}`, someRefs(partList));
    }),
  );
  const hasPowered = board.conditions.some((c) => c.powered);
  const hasUnpowered = board.conditions.some((c) => !c.powered);
  board.testPoints.forEach((t, i) => {
    if (t.stage !== undefined && !stageIds.includes(t.stage)) add('unknown-stage', `testPoints[${i}].stage`, `no stage "${t.stage}"${didYouMean(t.stage, stageIds)}`, `a stage id: ${stageIds.join(', ')}`);
    if (t.net === (t.refNet ?? board.ground)) add('test-point-short', `testPoints[${i}]`, `${t.id} measures net "${t.net}" against itself`, 'a net different from refNet (ground by default)');
    if (t.quantity === 'resistance' && !hasUnpowered) add('test-point-unusable', `testPoints[${i}].quantity`, `${t.id} is a resistance test point but every condition is powered`, 'at least one condition with "powered": false');
    if (t.quantity === 'voltage' && !hasPowered) add('test-point-unusable', `testPoints[${i}].quantity`, `${t.id} is a voltage test point but no condition is powered`, 'at least one condition with "powered": true');
  });

  // Rails.
  board.rails.forEach((r, i) => {
    if (r.net === board.ground) add('rail-on-ground', `rails[${i}].net`, `rail ${r.id} is on the ground net`, 'the net where the supply connects');
  });

  // Conditions: settings name controls, at positions they have.
  board.conditions.forEach((c, i) => {
    for (const [ref, setting] of Object.entries(c.settings)) {
      const path = `conditions[${i}].settings.${ref}`;
      const part = refs.get(ref);
      if (!part) {
        add('unknown-part', path, `no part "${ref}"${didYouMean(ref, partList)}`, 'the designator of a pot or switch');
        continue;
      }
      if (part.kind === 'pot') {
        if (typeof setting !== 'number') add('bad-setting', path, `${ref} is a pot; found ${JSON.stringify(setting)}`, 'a wiper position from 0 (pin 1 end) to 1 (pin 3 end)');
      } else if (part.kind === 'switch') {
        const names = Object.keys(part.positions ?? {});
        if (typeof setting !== 'string' || !names.includes(setting)) {
          add('bad-setting', path, `${ref} has no position ${JSON.stringify(setting)}${typeof setting === 'string' ? didYouMean(setting, names) : ''}`, `one of ${names.join(', ')}`);
        }
      } else {
        add('bad-setting', path, `${ref} is a ${part.kind}, not a control`, 'the designator of a pot or switch');
      }
    }
    if (c.signal) {
      if (c.signal.net === board.ground) add('signal-on-ground', `conditions[${i}].signal.net`, `the signal of ${c.id} is applied to ground`, 'the net the DC level goes to');
      if (!c.powered) add('signal-unpowered', `conditions[${i}].signal`, `${c.id} is unpowered but applies a signal (it would feed the board through its inputs)`, 'a signal only in a powered condition');
    }
  });

  // Model cards: parameter names the solver knows (a misspelt one would otherwise be ignored).
  for (const [name, model] of Object.entries(board.models)) {
    const spec = model.type === 'D' ? DIODE_PARAMS : BJT_PARAMS;
    const known = [...Object.keys(spec.defaults), ...Object.keys(spec.aliases ?? {}), ...spec.ignoredAtDc];
    for (const param of Object.keys(model.params)) {
      if (!known.includes(param.toUpperCase())) {
        add('unknown-model-param', `models.${name}.params.${param}`, `${model.type} model ${name} has no parameter "${param}"${didYouMean(param.toUpperCase(), known)}`, `SPICE ${model.type} parameters: ${Object.keys(spec.defaults).join(', ')}`);
      }
    }
    for (const [param, range] of Object.entries(model.spread ?? {})) {
      if (!(param in model.params)) add('unknown-model-param', `models.${name}.spread.${param}`, `spread given for "${param}", which model ${name} does not set`, `one of the model's params: ${Object.keys(model.params).join(', ')}`);
      if (range[0] > range[1]) add('bad-spread', `models.${name}.spread.${param}`, `spread [${range.join(', ')}] runs backwards`, '[low multiplier, high multiplier] with low ≤ high');
    }
  }
  board.parts.forEach((part, i) => {
    if (part.kind !== 'zener') return;
    const name = modelNameFor(part);
    const model = name === undefined ? undefined : (board.models[name] ?? BUILTIN_MODELS[name]);
    if (model && model.type === 'D' && !Object.keys(model.params).some((k) => k.toUpperCase() === 'BV')) {
      add('zener-without-bv', `parts[${i}].model`, `${part.ref} is a zener but model "${name}" sets no BV (breakdown voltage)`, 'a D model with BV, e.g. {"BV": 5.1, "IBV": 0.001}');
    }
  });

  // Roles point at things that exist and suit them.
  const tpById = new Map(board.testPoints.map((t) => [t.id, t]));
  const condById = new Map(board.conditions.map((c) => [c.id, c]));
  for (const [role, id] of Object.entries(board.roles.stages)) {
    if (id !== undefined && !stageIds.includes(id)) add('unknown-role-target', `roles.stages.${role}`, `no stage "${id}"${didYouMean(id, stageIds)}`, `a stage id: ${stageIds.join(', ')}`);
  }
  for (const [role, id] of Object.entries(board.roles.testPoints)) {
    if (id === undefined) continue;
    const tp = tpById.get(id);
    if (!tp) {
      add('unknown-role-target', `roles.testPoints.${role}`, `no test point "${id}"${didYouMean(id, [...tpById.keys()])}`, `a test point id: ${[...tpById.keys()].join(', ')}`);
      continue;
    }
    const want = TEST_POINT_ROLE_QUANTITY[role as keyof typeof TEST_POINT_ROLE_QUANTITY];
    if (want && tp.quantity !== want) add('role-quantity', `roles.testPoints.${role}`, `role ${role} is a ${want} measurement but ${id} is a ${tp.quantity} test point`, `a ${want} test point`);
  }
  for (const [role, list] of Object.entries(board.roles.parts)) {
    (list ?? []).forEach((ref, j) => {
      if (!refs.has(ref)) add('unknown-role-target', `roles.parts.${role}[${j}]`, `no part "${ref}"${didYouMean(ref, partList)}`, someRefs(partList));
    });
  }
  for (const [role, id] of Object.entries(board.roles.conditions)) {
    if (id === undefined) continue;
    const c = condById.get(id);
    if (!c) {
      add('unknown-role-target', `roles.conditions.${role}`, `no condition "${id}"${didYouMean(id, [...condById.keys()])}`, `a condition id: ${[...condById.keys()].join(', ')}`);
      continue;
    }
    const powered = CONDITION_ROLE_POWERED[role as keyof typeof CONDITION_ROLE_POWERED];
    if (powered !== undefined && c.powered !== powered) add('role-powered', `roles.conditions.${role}`, `role ${role} is ${powered ? 'a powered' : 'an unpowered'} condition but ${id} is ${c.powered ? 'powered' : 'unpowered'}`, `a condition with "powered": ${powered}`);
  }
  return problems;
}

type Add = (code: string, path: string, message: string, accepted?: string) => void;

function duplicates(ids: string[], list: string, key: string, what: string, add: Add) {
  const first = new Map<string, number>();
  ids.forEach((id, i) => {
    const j = first.get(id);
    if (j === undefined) first.set(id, i);
    else add('duplicate-id', `${list}[${i}].${key}`, `${what} ${id} is used again (first at ${list}[${j}])`, `a ${what} used once`);
  });
}

function pinPath(board: Board, net: string): string {
  const i = board.parts.findIndex((p) => Object.values(p.pins).includes(net));
  if (i < 0) return 'parts';
  const pin = Object.entries(board.parts[i].pins).find(([, n]) => n === net)![0];
  return `parts[${i}].pins.${pin}`;
}

function checkPins(part: Part, at: string, add: Add) {
  const fixed = FIXED_PINS[part.kind];
  const required = requiredPins(part);
  for (const [pin, net] of Object.entries(part.pins)) {
    if (part.kind !== 'connector' && required && !required.includes(pin)) {
      add('unknown-pin', `${at}.pins.${pin}`, `${part.ref} (${part.kind}) has no pin "${pin}"${fixed ? didYouMean(pin, fixed) : ''}`, acceptedPinsText(part));
    }
    if (net.trim() === '') add('pin-on-no-net', `${at}.pins.${pin}`, `${part.ref} pin ${pin} has an empty net name`, 'a net name');
  }
  for (const pin of required ?? []) {
    if (!(pin in part.pins)) add('pin-on-no-net', `${at}.pins`, `${part.ref} pin "${pin}" is on no net`, `every pin of a ${part.kind} on a net: ${acceptedPinsText(part)}`);
  }
  // A two-terminal part with both ends on one net does nothing: almost always a copied net name.
  if (fixed?.length === 2) {
    const [a, b] = fixed;
    if (part.pins[a] !== undefined && part.pins[a] === part.pins[b]) {
      add('shorted-part', `${at}.pins`, `${part.ref} has both pins on net "${part.pins[a]}"`, 'its two pins on two different nets');
    }
  }
}

function checkValue(part: Part, at: string, add: Add) {
  const range = VALUE_RANGE[part.kind];
  if (!VALUED_KINDS.has(part.kind)) {
    if (part.value !== undefined) {
      add('unexpected-value', `${at}.value`, `${part.ref} is a ${part.kind}; it takes no value`, MODEL_TYPE[part.kind] || OPAMP_KINDS.has(part.kind) ? 'a "model" name instead' : 'no value');
    }
    return;
  }
  if (part.value === undefined || !range) {
    add('missing-value', `${at}.value`, `${part.ref} (${part.kind}) has no value`, `a value in ${range?.unit}, e.g. ${example(part.kind)}`);
    return;
  }
  let value: number | undefined;
  try {
    value = parsePartValue(part, `${at}.value`).value;
  } catch (error) {
    if (!(error instanceof UserInputError)) throw error;
    const p = error.problems[0];
    add('bad-value', `${at}.value`, `${part.ref}: ${p.message}`, p.accepted);
    return;
  }
  if (value === undefined) return;
  if (!(value >= range.min && value <= range.max)) {
    add(
      'bad-value',
      `${at}.value`,
      `${part.ref}: ${formatValue(value, range.unit)} is not a value a ${part.kind} can have`,
      `${formatValue(range.min, range.unit)} to ${formatValue(range.max, range.unit)}, e.g. ${example(part.kind)}`,
    );
  }
}

function example(kind: Part['kind']): string {
  return ({ resistor: '4k7', pot: '100k', capacitor: '100n', electrolytic: '10u', inductor: '10m' } as Record<string, string>)[kind] ?? '';
}

function checkModel(board: Board, part: Part, at: string, add: Add) {
  const type = MODEL_TYPE[part.kind];
  const name = modelNameFor(part);
  if (OPAMP_KINDS.has(part.kind)) {
    const names = [...Object.keys(board.opampModels), ...Object.keys(BUILTIN_OPAMP_MODELS)];
    if (name !== undefined && !board.opampModels[name] && !BUILTIN_OPAMP_MODELS[name]) {
      add('unknown-model', `${at}.model`, `no op-amp model "${name}"${didYouMean(name, names)}`, `a key of "opampModels" or a built-in model: ${Object.keys(BUILTIN_OPAMP_MODELS).join(', ')}`);
    }
    return;
  }
  if (!type) {
    if (part.model !== undefined) add('unexpected-model', `${at}.model`, `${part.ref} is a ${part.kind}; it takes no model`, 'a "value" instead');
    return;
  }
  const names = [...Object.keys(board.models), ...Object.keys(BUILTIN_MODELS)];
  if (name === undefined) {
    add('missing-model', `${at}.model`, `${part.ref} (${part.kind}) names no model`, `a key of "models" with type ${type}`);
    return;
  }
  const model = board.models[name] ?? BUILTIN_MODELS[name];
  if (!model) {
    add('unknown-model', `${at}.model`, `no model "${name}"${didYouMean(name, names)}`, `a key of "models" or a built-in model: ${Object.keys(BUILTIN_MODELS).join(', ')}`);
  } else if (model.type !== type) {
    add('model-type', `${at}.model`, `${part.ref} is a ${part.kind} but model "${name}" is type ${model.type}`, `a model of type ${type}`);
  }
}

function checkControls(part: Part, at: string, add: Add) {
  if (part.taper !== undefined && part.kind !== 'pot') add('unexpected-key', `${at}.taper`, `${part.ref} is a ${part.kind}; only pots have a taper`, 'no "taper"');
  if (part.positions !== undefined && part.kind !== 'switch') add('unexpected-key', `${at}.positions`, `${part.ref} is a ${part.kind}; only switches have positions`, 'no "positions"');
  if (part.kind === 'pot' && typeof part.position === 'string') {
    add('bad-setting', `${at}.position`, `${part.ref} is a pot; found ${JSON.stringify(part.position)}`, 'a wiper position from 0 (pin 1 end) to 1 (pin 3 end)');
  }
  if (part.kind === 'switch') {
    const names = Object.keys(part.positions ?? {});
    if (names.length === 0) add('missing-positions', `${at}.positions`, `switch ${part.ref} lists no positions`, 'position name -> the pin pairs it connects, e.g. {"off": [], "on": [["1","2"]]}');
    if (part.position !== undefined && (typeof part.position !== 'string' || !names.includes(part.position))) {
      add('bad-setting', `${at}.position`, `${part.ref} has no position ${JSON.stringify(part.position)}${typeof part.position === 'string' ? didYouMean(part.position, names) : ''}`, `one of ${names.join(', ')}`);
    }
  } else if (part.kind !== 'pot' && part.position !== undefined) {
    add('unexpected-key', `${at}.position`, `${part.ref} is a ${part.kind}; only pots and switches have a position`, 'no "position"');
  }
}
