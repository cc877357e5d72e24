// Command-line arguments through node's util.parseArgs. Unknown options are refused with a
// "did you mean"; values are checked here so commands get clean, typed input.
import { parseArgs } from 'util';
import { KinsortError, didYouMean } from '../core/errors';

export interface OptionSpec {
  readonly type: 'string' | 'boolean';
  readonly short?: string;
}

export interface ParsedArgs {
  readonly values: Record<string, string | boolean | undefined>;
  readonly positionals: string[];
}

export function parseCommandArgs(command: string, args: readonly string[], spec: Record<string, OptionSpec>): ParsedArgs {
  const options = { ...spec, help: { type: 'boolean' as const, short: 'h' } };
  // strict: false so that we word the errors ourselves (with a did-you-mean) instead of node.
  const { values, positionals, tokens } = parseArgs({ args: [...args], options, strict: false, allowPositionals: true, tokens: true });
  const names = Object.keys(options);
  const seen = new Set<string>();
  for (const token of tokens ?? []) {
    if (token.kind !== 'option') continue;
    if (!names.includes(token.name)) {
      throw new KinsortError(
        `${command}: unknown option "${token.rawName}".${didYouMean(token.name, names).replace(/"([^"]+)"\?$/, '"--$1"?')} ` +
          `Run "kinsort ${command} --help" for the options.`,
        'unknown-option',
      );
    }
    // A flag given twice would silently take the last value: say so instead.
    if (seen.has(token.name)) {
      throw new KinsortError(`${command}: option --${token.name} is given more than once; give it once.`, 'bad-option');
    }
    seen.add(token.name);
    const want: OptionSpec['type'] = new Map(Object.entries(options as Record<string, OptionSpec>)).get(token.name)!.type;
    if (want === 'string' && token.value === undefined) {
      throw new KinsortError(`${command}: option --${token.name} needs a value, e.g. --${token.name} VALUE.`, 'bad-option');
    }
    if (want !== 'string' && token.value !== undefined) {
      throw new KinsortError(`${command}: option --${token.name} takes no value (got "${token.value}").`, 'bad-option');
    }
  }
  return { values: values as ParsedArgs['values'], positionals };
}

export function requireString(values: ParsedArgs['values'], name: string, command: string): string {
  const v = values[name];
  if (typeof v !== 'string' || v === '') {
    throw new KinsortError(`${command}: --${name} is required. Run "kinsort ${command} --help".`, 'bad-option');
  }
  return v;
}

export function optionalString(values: ParsedArgs['values'], name: string): string | undefined {
  const v = values[name];
  return typeof v === 'string' ? v : undefined;
}

/** "a,b, c" → ["a", "b", "c"]; empty names refused. */
export function listOption(value: string, name: string, command: string): string[] {
  const list = value.split(',').map((s) => s.trim());
  if (list.some((s) => s === '')) {
    throw new KinsortError(`${command}: --${name} "${value}" has an empty name; give names separated by commas.`, 'bad-option');
  }
  return list;
}

export function integerOption(value: string | undefined, name: string, command: string, min: number): number | undefined {
  if (value === undefined) return undefined;
  const n = Number(value);
  if (!/^[+-]?\d+$/.test(value.trim()) || !Number.isSafeInteger(n) || n < min) {
    throw new KinsortError(`${command}: --${name} must be a whole number ≥ ${min}; got "${value}".`, 'bad-option');
  }
  return n;
}

export function exactPositionals(positionals: string[], names: readonly string[], command: string): string[] {
  if (positionals.length !== names.length) {
    const shown = positionals.length === 0 ? 'none' : positionals.map((p) => `"${p}"`).join(', ');
    throw new KinsortError(`${command}: expected ${names.join(' and ')}; got ${shown}. Run "kinsort ${command} --help".`, 'bad-argument');
  }
  return positionals;
}
