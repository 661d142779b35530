import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

/**
 * The client's feature folders (projects/traceloom/src/app/<feature>/) import each other in one
 * direction only: a page composes the features below it, and shared pieces live in `shared/`
 * and `core/`. This reads every non-spec source file's relative imports and fails on any cycle
 * between folders (a folder-level check: a file-level cycle tool would not see runs -> checks ->
 * runs through different files).
 */
const app = path.resolve(
  path.dirname(fileURLToPath(import.meta.url)),
  '../projects/traceloom/src/app',
);

function sources(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) return sources(p);
    return e.name.endsWith('.ts') && !e.name.endsWith('.spec.ts') ? [p] : [];
  });
}

/** Feature -> the other features it imports from. */
function featureGraph(): Map<string, Set<string>> {
  const graph = new Map<string, Set<string>>();
  for (const file of sources(app)) {
    const feature = path.relative(app, file).split(path.sep)[0]!;
    if (!path.relative(app, file).includes(path.sep)) continue; // app.ts, app.routes.ts
    for (const [, spec] of readFileSync(file, 'utf8').matchAll(/from '(\.\.?\/[^']+)'/g)) {
      const target = path.relative(app, path.resolve(path.dirname(file), spec!)).split(path.sep);
      if (target.length < 2 || target[0] === feature) continue;
      if (!graph.has(feature)) graph.set(feature, new Set());
      graph.get(feature)!.add(target[0]!);
    }
  }
  return graph;
}

/** Every cycle's path (a -> b -> a), found by depth-first search. */
function cycles(graph: Map<string, Set<string>>): string[] {
  const found = new Set<string>();
  const walk = (node: string, trail: string[]) => {
    for (const next of graph.get(node) ?? []) {
      const at = trail.indexOf(next);
      if (at >= 0) found.add([...trail.slice(at), next].join(' -> '));
      else walk(next, [...trail, next]);
    }
  };
  for (const start of graph.keys()) walk(start, [start]);
  return [...found];
}

describe('client feature folders', () => {
  it('import each other without a cycle', () => {
    const graph = featureGraph();
    // The check sees the pages' imports (a run page composes checks, plots and large N).
    expect(graph.get('runs')).toContain('checks');
    expect(cycles(graph)).toEqual([]);
  });

  it('finds a cycle when there is one', () => {
    const graph = new Map([
      ['runs', new Set(['checks'])],
      ['checks', new Set(['runs'])],
    ]);
    expect(cycles(graph)).toContain('runs -> checks -> runs');
  });
});
