import {
  DISABLED_FUNCTIONS,
  EngineError,
  EXACT_FUNCTIONS,
  NUMERIC_FUNCTIONS,
  parseExpression,
  type GasSpec,
} from '@traceloom/shared/engine';
import { fieldLabel } from '@traceloom/shared/format';
import type { MathNode } from 'mathjs';
import { AppError } from '../http/app-error.js';
import { specExpressions } from './gas-input.js';

/**
 * Characters of expression text one request may have parsed on the main thread (mathjs parses
 * about 0.5-1 KB per millisecond here, see docs/operations.md): enough for every ordinary gas;
 * the rest of a very long spec is scanned for names only, and its syntax left to the probe.
 */
export const MAIN_PATH_PARSE_CHARS = 4 * 1024;
/** Extra expressions past the budget parsed to confirm a name the scan flags. */
const CONFIRMATIONS = 4;

/** Names either language knows: refused here only when neither does, so no valid gas is. */
const KNOWN = new Set([...EXACT_FUNCTIONS, ...NUMERIC_FUNCTIONS]);
const DISABLED = new Set<string>(DISABLED_FUNCTIONS);
/** A name written before an opening bracket: what a function call looks like to a scan. */
const CALL_LIKE = /(?<![\w.])([A-Za-z_][A-Za-z0-9_]*)\s*\(/g;

function refuse(message: string, field: string): never {
  throw new AppError(400, 'invalid_spec', `${fieldLabel(field)}: ${message}.`, field);
}

function flaggedByScan(text: string): boolean {
  for (const [, name] of text.matchAll(CALL_LIKE)) if (!KNOWN.has(name!)) return true;
  return false;
}

/** The first called function of a parse tree that neither language knows, if any. */
function unknownCall(tree: MathNode): string | undefined {
  let found: string | undefined;
  tree.traverse((node) => {
    if (found !== undefined || node.type !== 'FunctionNode') return;
    const fn = (node as unknown as { fn: { type: string; name?: string } }).fn;
    if (fn.type === 'SymbolNode' && (DISABLED.has(fn.name!) || !KNOWN.has(fn.name!))) {
      found = fn.name;
    }
  });
  return found;
}

/**
 * The cheap check of a gas before it is stored, on the main thread and without the probe: each
 * expression's syntax (up to `MAIN_PATH_PARSE_CHARS` of text in all) and the functions it calls.
 * An unknown or disabled function, or text that does not parse, is refused at once with 400
 * `invalid_spec` naming the field; the probe still evaluates what this passes.
 */
export function assertNamesKnown(spec: GasSpec): void {
  let parsed = 0;
  let confirmations = 0;
  for (const [path, text] of specExpressions(spec)) {
    const field = `spec.${path}`;
    const inBudget = parsed + text.length <= MAIN_PATH_PARSE_CHARS;
    if (!inBudget) {
      if (confirmations >= CONFIRMATIONS || !flaggedByScan(text)) continue;
      confirmations += 1;
    }
    parsed += text.length;
    let tree: MathNode;
    try {
      tree = parseExpression(text);
    } catch (e) {
      if (e instanceof EngineError) refuse(e.message, field);
      throw e;
    }
    let name: string | undefined;
    try {
      name = unknownCall(tree);
    } catch {
      continue; // a tree too deep to walk here (thousands of signs): the probe judges it
    }
    if (name === undefined) continue;
    refuse(DISABLED.has(name) ? `function ${name} is disabled` : `unknown function ${name}`, field);
  }
}
