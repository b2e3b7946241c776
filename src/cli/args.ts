import { parseArgs, type ParseArgsConfig } from 'node:util';
import { UsageError } from '../errors.js';

type Options = NonNullable<ParseArgsConfig['options']>;

/**
 * Strict option parsing on node's own parseArgs: an unknown option or a missing value is a usage
 * error (exit 2) that names the option, never a stack trace.
 */
export function parseOptions<O extends Options>(args: string[], options: O, allowPositionals = true) {
  try {
    return parseArgs({ args, options, allowPositionals, strict: true });
  } catch (error) {
    const message = error instanceof Error ? error.message.replace(/^.*?: /, '') : String(error);
    throw new UsageError(message.split('\n')[0] ?? 'bad arguments');
  }
}
