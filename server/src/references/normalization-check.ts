import type { ReferenceRow } from '@traceloom/shared/api';
import Fraction from 'fraction.js';
import { EngineError, evaluateSeries, parseExpression } from '@traceloom/shared/engine';
import { AppError } from '../http/app-error.js';

/** Names a numeric normalization may read besides N (the numeric language's constants). */
const NUMERIC_CONSTANTS = new Set(['pi', 'e']);

interface Node {
  type: string;
  name?: string;
  fn?: { name?: string };
  args?: Node[];
  forEach(callback: (child: Node) => void): void;
}

/** The names an expression reads that no sum or prod binds, in order of appearance. */
function readNames(node: Node, bound: ReadonlySet<string>, out: string[]): void {
  if (node.type === 'SymbolNode') {
    if (!bound.has(node.name!) && !out.includes(node.name!)) out.push(node.name!);
    return;
  }
  if (node.type === 'FunctionNode') {
    const args = node.args ?? [];
    const index = args[1];
    const binder = node.fn?.name === 'sum' || node.fn?.name === 'prod';
    args.forEach((arg, i) => {
      const inner = binder && i === 0 && index?.type === 'SymbolNode';
      if (binder && i === 1 && index?.type === 'SymbolNode') return;
      readNames(arg, inner ? new Set(bound).add(index.name!) : bound, out);
    });
    return;
  }
  node.forEach((child) => readNames(child, bound, out));
}

function refuse(message: string): never {
  throw new AppError(400, 'invalid_input', `normalization: ${message}.`, 'normalization');
}

/**
 * Checks a reference table's normalization before anything is stored: it may read only N and
 * the table's variable (a numeric table: N, pi and e), and for a series table it must evaluate
 * at every row's N. Refuses with 400 naming the `normalization` field otherwise.
 */
export function checkNormalization(
  text: string,
  variable: string,
  rows: readonly ReferenceRow[],
  numeric: boolean,
): void {
  let tree: Node;
  try {
    tree = parseExpression(text) as unknown as Node;
  } catch (e) {
    if (!(e instanceof EngineError)) throw e;
    refuse(e.message);
  }
  const names: string[] = [];
  readNames(tree, new Set(), names);
  const allowed = (name: string) =>
    name === 'N' || (numeric ? NUMERIC_CONSTANTS.has(name) : name === variable);
  const unknown = names.find((name) => !allowed(name));
  if (unknown !== undefined) {
    const may = numeric ? 'N, pi and e' : `N and the variable ${variable}`;
    refuse(`unknown symbol ${unknown} (it may use ${may})`);
  }
  if (numeric) return;
  const nMax = Math.max(0, ...rows.map((r) => r.N));
  for (const N of new Set(rows.map((r) => r.N))) {
    try {
      evaluateSeries(text, { variable, cap: new Fraction(1), nMax, bindings: { N } });
    } catch (e) {
      if (!(e instanceof EngineError)) throw e;
      refuse(`${e.message} at N = ${N}`);
    }
  }
}
