/**
 * Reading a `.model` card against what a device supports. Supported parameters get SPICE's
 * defaults when absent; parameters that only matter for charge storage, noise or temperature
 * are accepted and listed in the device's "ignored at DC" list; anything else is named in a
 * warning, never dropped silently.
 */
import { UserInputError } from '../errors.js';
import type { Circuit, Model, ModelType } from './netlist.js';
import { NOMINAL_TEMPERATURE_C } from './constants.js';

export interface ParamSpec {
  defaults: Record<string, number>;
  /** Alternative names SPICE accepts, mapped to the canonical one (VA → VAF). */
  aliases?: Record<string, string>;
  /** Accepted, without effect on a DC operating point or small-signal AC without charge storage. */
  ignoredAtDc: readonly string[];
  /** Of the ignored ones, those that would matter away from the nominal temperature. */
  temperatureOnly?: readonly string[];
}

export function findModel(circuit: Circuit, element: string, name: string, types: ModelType[]): Model {
  const model = circuit.models[name.toLowerCase()];
  if (!model) {
    const known = Object.keys(circuit.models);
    throw new UserInputError({
      code: 'circuit.unknown-model',
      path: `elements.${element}.model`,
      message: `${element} uses model "${name}", which is not defined`,
      accepted: known.length ? `one of ${known.join(', ')}` : 'a model defined by a .model card',
    });
  }
  if (!types.includes(model.type)) {
    throw new UserInputError({
      code: 'circuit.model-type',
      path: `elements.${element}.model`,
      message: `${element} uses model "${name}" of type ${model.type}`,
      accepted: `a model of type ${types.join(' or ')}`,
    });
  }
  return model;
}

export function readModelParams(
  model: Model,
  spec: ParamSpec,
  temperatureC: number,
  warn: (message: string) => void,
): Record<string, number> {
  const out: Record<string, number> = { ...spec.defaults };
  const unknown: string[] = [];
  const temperatureSensitive: string[] = [];
  for (const [rawName, value] of Object.entries(model.params)) {
    const upper = rawName.toUpperCase();
    const name = spec.aliases?.[upper] ?? upper;
    if (name in spec.defaults) {
      if (typeof value !== 'number' || !Number.isFinite(value)) {
        throw new UserInputError({
          code: 'circuit.bad-model-param',
          path: `models.${model.name}.${upper}`,
          message: `${upper} of model ${model.name} is ${String(value)}`,
          accepted: 'a finite number',
        });
      }
      out[name] = value;
    } else if (spec.ignoredAtDc.includes(name)) {
      if (spec.temperatureOnly?.includes(name)) temperatureSensitive.push(name);
    } else {
      unknown.push(upper);
    }
  }
  if (unknown.length) {
    warn(`model ${model.name}: parameter${unknown.length > 1 ? 's' : ''} ${unknown.join(', ')} not supported, ignored`);
  }
  if (temperatureSensitive.length && temperatureC !== NOMINAL_TEMPERATURE_C) {
    warn(
      `model ${model.name}: temperature scaling (${temperatureSensitive.join(', ')}) is not modelled; ` +
        `only kT/q follows the ${temperatureC} °C analysis temperature`,
    );
  }
  return out;
}

/** Every parameter name a device reads at DC, with the aliases SPICE accepts for them. */
export function settableParams(spec: ParamSpec): string[] {
  return [...Object.keys(spec.defaults), ...Object.keys(spec.aliases ?? {})];
}

/**
 * Checks one parameter change as a card's value would be checked: the name, in any case or alias
 * spelling, must be one the device reads at DC, and the value a finite number. Returns the
 * canonical name, under which the device's resolved parameters (readModelParams' result) hold it.
 */
function paramToSet(spec: ParamSpec, element: string, name: string, value: number): string {
  const upper = name.toUpperCase();
  const canonical = spec.aliases?.[upper] ?? upper;
  if (!(canonical in spec.defaults)) {
    throw new UserInputError({
      code: 'circuit.bad-value',
      path: `elements.${element}.${name}`,
      message: `${element} has no model parameter ${name} that can be changed`,
      accepted: settableParams(spec).join(', '),
    });
  }
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new UserInputError({
      code: 'circuit.bad-model-param',
      path: `elements.${element}.${name}`,
      message: `${canonical} of ${element} is ${String(value)}`,
      accepted: 'a finite number',
    });
  }
  return canonical;
}

/**
 * Sets one checked parameter in a device's own resolved parameters and derives the device's law
 * from them; if the law refuses the value, the parameter is put back and the error thrown. In
 * place rather than copied: tolerance loops set parameters once per sample.
 */
export function setParam<T>(params: Record<string, number>, spec: ParamSpec, element: string, name: string, value: number, derive: () => T): T {
  const canonical = paramToSet(spec, element, name, value);
  const old = params[canonical];
  params[canonical] = value;
  try {
    return derive();
  } catch (error) {
    params[canonical] = old;
    throw error;
  }
}
