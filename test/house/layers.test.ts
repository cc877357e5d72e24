// The house rules of DESIGN.md, checked on every run: src/ imports only point down the layers, and
// no two modules import each other, directly or around a loop. The imports are read from the source
// text (static `import … from`, `export … from`, `import(…)` and `require(…)` with a relative path).
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

const SRC = resolve(__dirname, '../../src');

// Lower numbers sit lower. A module may import its own layer or any lower one, never a higher one.
const LAYER_RANK: ReadonlyMap<string, number> = new Map([
  ['random.ts', 0],
  ['core', 0],
  ['table', 1],
  ['prepare', 2],
  ['measure', 2],
  ['methods', 3],
  ['assess', 4],
  ['engines', 5],
  ['segments', 6],
  // The display adapter (inline in a kernel, or files outside one) knows nothing of views; views
  // hand it finished HTML, so it sits below them.
  ['notebook', 7],
  ['views', 8],
  ['study', 10],
  ['cli', 11],
  ['index.ts', 12],
  ['internal.ts', 12],
]);

function sourceFiles(folder: string): string[] {
  const found: string[] = [];
  for (const name of readdirSync(folder)) {
    const path = join(folder, name);
    if (statSync(path).isDirectory()) found.push(...sourceFiles(path));
    else if (name.endsWith('.ts')) found.push(path);
  }
  return found;
}

const IMPORT_PATTERN = /(?:^|\n)\s*(?:import|export)\s[^;]*?\sfrom\s+'(\.[^']+)'|(?:import|require)\(\s*'(\.[^']+)'\s*\)/g;

/** Relative imports of a file; `valueOnly` leaves out `import type` / `export type` (erased at run time). */
function importsOf(file: string, valueOnly = false): string[] {
  const text = readFileSync(file, 'utf8');
  const targets: string[] = [];
  for (const match of text.matchAll(IMPORT_PATTERN)) {
    if (valueOnly && /^\s*(?:import|export)\s+type\s/.test(match[0])) continue;
    const spec = match[1] ?? match[2];
    const base = resolve(dirname(file), spec);
    const candidates = [`${base}.ts`, join(base, 'index.ts'), base];
    const target = candidates.find((c) => {
      try {
        return statSync(c).isFile();
      } catch {
        return false;
      }
    });
    if (target === undefined) throw new Error(`${relative(SRC, file)}: cannot resolve '${spec}'`);
    targets.push(target);
  }
  return targets;
}

function layerOf(file: string): string {
  return relative(SRC, file).split('/')[0];
}

const files = sourceFiles(SRC);
const graph = new Map(files.map((f) => [f, importsOf(f)]));
// Cycles are looked for among the imports that exist at run time: a type-only import back (for
// example a helper naming its caller's result type) is erased and orders nothing.
const runtimeGraph = new Map(files.map((f) => [f, importsOf(f, true)]));

describe('the layers of src/ (DESIGN.md)', () => {
  it('places every top-level folder in a layer', () => {
    const unplaced = [...new Set(files.map(layerOf))].filter((l) => !LAYER_RANK.has(l));
    expect(unplaced).toEqual([]);
  });

  it('never imports upwards', () => {
    const upward: string[] = [];
    for (const [file, targets] of graph) {
      for (const target of targets) {
        if (LAYER_RANK.get(layerOf(target))! > LAYER_RANK.get(layerOf(file))!) {
          upward.push(`${relative(SRC, file)} -> ${relative(SRC, target)}`);
        }
      }
    }
    expect(upward).toEqual([]);
  });

  it('has no import cycles between modules (run-time imports)', () => {
    // Tarjan's strongly connected components; any component of two or more modules is a cycle.
    const index = new Map<string, number>();
    const low = new Map<string, number>();
    const stack: string[] = [];
    const onStack = new Set<string>();
    const cycles: string[][] = [];
    let counter = 0;
    const visit = (node: string): void => {
      index.set(node, counter);
      low.set(node, counter);
      counter++;
      stack.push(node);
      onStack.add(node);
      for (const next of runtimeGraph.get(node) ?? []) {
        if (!index.has(next)) {
          visit(next);
          low.set(node, Math.min(low.get(node)!, low.get(next)!));
        } else if (onStack.has(next)) {
          low.set(node, Math.min(low.get(node)!, index.get(next)!));
        }
      }
      if (low.get(node) === index.get(node)) {
        const component: string[] = [];
        let member: string;
        do {
          member = stack.pop()!;
          onStack.delete(member);
          component.push(relative(SRC, member));
        } while (member !== node);
        if (component.length > 1) cycles.push(component.sort());
      }
    };
    for (const file of files) if (!index.has(file)) visit(file);
    expect(cycles).toEqual([]);
  });
});
