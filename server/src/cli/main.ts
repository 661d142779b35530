#!/usr/bin/env node
/**
 * Traceloom command line: `traceloom compute SPEC.json [--format json|table|csv|latex|matrix]`
 * (`matrix`: the coefficient matrix N x exponent of a series table, as CSV).
 * `-` reads the spec from stdin. The JSON result streams its class rows as they are produced.
 * Bad input: exit 2 with one line on stderr naming the field; never a stack trace.
 */
import { readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import {
  compute,
  describeError,
  EngineError,
  parseGasSpec,
  type ComputeResult,
} from '@traceloom/shared';
import { renderCsv, renderLatex, renderMatrix, renderTable } from '@traceloom/shared/format';

const USAGE = 'usage: traceloom compute SPEC.json|- [--format json|table|csv|latex|matrix]';

const RENDERERS = {
  table: renderTable,
  csv: renderCsv,
  latex: renderLatex,
  matrix: renderMatrix,
} as const;

class UsageError extends Error {}

/** Buffered stdout writer (few large writes instead of many small ones). */
function bufferedOut() {
  let buf = '';
  return {
    write(s: string): void {
      buf += s;
      if (buf.length > 1 << 16) {
        process.stdout.write(buf);
        buf = '';
      }
    },
    flush(): void {
      if (buf) process.stdout.write(buf);
      buf = '';
    },
  };
}

function readSpec(path: string): unknown {
  let text: string;
  try {
    text = readFileSync(path === '-' ? 0 : path, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new UsageError(
      code === 'ENOENT'
        ? `spec file not found: ${path}`
        : `cannot read ${path}: ${code ?? 'error'}`,
    );
  }
  try {
    return JSON.parse(text);
  } catch (e) {
    throw new UsageError(`spec: not valid JSON (${(e as Error).message})`);
  }
}

/** The JSON result with the class rows streamed between the spec and the rest. */
function streamJson(input: unknown): void {
  const spec = parseGasSpec(input);
  const out = bufferedOut();
  let opened = false;
  const open = (): void => {
    out.write(`{"format":"traceloom.result/1","spec":${JSON.stringify(spec)},"classes":[`);
    opened = true;
  };
  let first = true;
  const onClassText = (text: string): void => {
    if (!opened) open();
    out.write(first ? '\n' : ',\n');
    out.write(text);
    first = false;
  };
  const result: ComputeResult = compute(input, { onClassText, collectClasses: false });
  if (!opened) open();
  const { format: _f, spec: _s, classes: _c, ...rest } = result;
  out.write(
    `]${JSON.stringify(rest).replace(/^\{/, rest && Object.keys(rest).length ? ',' : '')}\n`,
  );
  out.flush();
}

function main(argv: string[]): number {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      strict: true,
      options: {
        format: { type: 'string', short: 'f', default: 'json' },
        help: { type: 'boolean', short: 'h' },
      },
    });
  } catch (e) {
    throw new UsageError(`${(e as Error).message.split(/\.\s/)[0]!.replace(/\.$/, '')} (${USAGE})`);
  }
  if (parsed.values.help) {
    process.stdout.write(`${USAGE}\n`);
    return 0;
  }
  const [command, file, ...extra] = parsed.positionals;
  if (command !== 'compute')
    throw new UsageError(command ? `unknown command ${command} (${USAGE})` : USAGE);
  if (!file) throw new UsageError(`compute needs a spec file or - (${USAGE})`);
  if (extra.length) throw new UsageError(`unexpected argument ${extra[0]} (${USAGE})`);
  const format = parsed.values.format;
  if (format !== 'json' && !(format in RENDERERS)) {
    throw new UsageError(`--format must be json, table, csv, latex or matrix, not ${format}`);
  }
  const input = readSpec(file);
  if (format === 'json') {
    streamJson(input);
    return 0;
  }
  const numeric = typeof input === 'object' && input !== null && 'precision' in input;
  if (format === 'matrix' && numeric) {
    throw new UsageError('--format matrix needs a series gas: a numeric table has no coefficients');
  }
  const result = compute(input);
  process.stdout.write(RENDERERS[format as keyof typeof RENDERERS](result));
  return 0;
}

try {
  process.exitCode = main(process.argv.slice(2));
} catch (e) {
  if (e instanceof UsageError) {
    process.stderr.write(`${e.message}\n`);
    process.exitCode = 2;
  } else if (e instanceof EngineError) {
    process.stderr.write(`${describeError(e)}\n`);
    process.exitCode = 2;
  } else {
    const msg = e instanceof Error ? e.message : String(e);
    process.stderr.write(`internal error: ${msg.split('\n')[0]}\n`);
    process.exitCode = 1;
  }
}
