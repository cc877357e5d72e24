// docs/public-api.md documents every export of the package root in one line, and states how many
// there are. The exports are read from src/index.ts by the TypeScript compiler (values: anything
// with a run-time binding, the classes exported as types counted as types).
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const ROOT = resolve(__dirname, '../..');
const entry = resolve(ROOT, 'src/index.ts');
const program = ts.createProgram([entry], { strict: true, skipLibCheck: true, noEmit: true });
const checker = program.getTypeChecker();
const exported = checker.getExportsOfModule(checker.getSymbolAtLocation(program.getSourceFile(entry)!)!);
const text = readFileSync(resolve(ROOT, 'src/index.ts'), 'utf8');

/** A value export is one with a run-time binding: not under `export type`. */
function isValue(symbol: ts.Symbol): boolean {
  const declaration = symbol.declarations?.[0];
  if (declaration && ts.isExportSpecifier(declaration)) return !declaration.isTypeOnly && !declaration.parent.parent.isTypeOnly;
  return (checker.getAliasedSymbol(symbol).flags & ts.SymbolFlags.Value) !== 0;
}

const values = exported.filter(isValue).map((s) => s.name);
const types = exported.filter((s) => !isValue(s)).map((s) => s.name);
const doc = readFileSync(resolve(ROOT, 'docs/public-api.md'), 'utf8');

describe('docs/public-api.md', () => {
  it('has one line for every root export', () => {
    const documented = new Set([...doc.matchAll(/^- `([A-Za-z_$][\w$]*)/gm)].map((m) => m[1]));
    const missing = [...values, ...types].filter((n) => !documented.has(n));
    expect(missing, 'root exports without a line in docs/public-api.md').toEqual([]);
    const stale = [...documented].filter((n) => !values.includes(n) && !types.includes(n));
    expect(stale, 'lines in docs/public-api.md for names the root does not export').toEqual([]);
  });

  it('states the counts, and the root stays well under 100 values', () => {
    expect(doc).toContain(`**${values.length} values**`);
    expect(doc).toContain(`**${types.length} types**`);
    expect(values.length).toBeLessThan(100);
    expect(text).not.toMatch(/^export \*/m);
  });
});
