import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

// The product's vocabulary (DEVELOPERS.md "Vocabulary", docs/getting-started.md "Words
// Traceloom uses"): one word for each thing. This test keeps the variants it replaced out of
// the screens, the server's messages, the shared renderers and the Guide.
const root = fileURLToPath(new URL('../../', import.meta.url));

function files(dir: string, ext: RegExp): string[] {
  const out: string[] = [];
  for (const name of readdirSync(join(root, dir))) {
    const path = join(dir, name);
    if (statSync(join(root, path)).isDirectory()) out.push(...files(path, ext));
    else if (ext.test(name) && !/\.spec\.ts$/.test(name)) out.push(path);
  }
  return out;
}

const SOURCES = [
  ...files('projects/traceloom/src/app', /\.(html|ts)$/),
  ...files('server/src', /\.ts$/),
  ...files('shared/src/format', /\.ts$/),
  ...files('docs', /\.md$/),
];

/** [what the variant was, the pattern that finds it, the word to use instead]. */
const BANNED: [string, RegExp, string][] = [
  ['a shouted mismatch word', /\b(DIFFERS|DISAGREE)\b|'NO'/, 'differs'],
  [
    'expected/found as verdict sides',
    /\bexpected \$\{|\bfound \$\{|firstMismatch\??\.(expected|found)/,
    'computed / supplied',
  ],
  ['another phrase for "agrees below q^k"', /agrees to O\(|below exponent\b/, 'agrees below q^k'],
  [
    'colour words for check statuses',
    /status === '(green|red)'|'(green|red)'|\b(green|red) checks?\b/,
    'passes / fails / waived',
  ],
  ['an icon name as text', /<mat-icon\b(?:[^>/]|\/(?!>))*>\s*[^<\s]/, 'fontIcon with aria-hidden'],
  [
    'an internal field path in a message',
    /'key: |'spec\.[A-Za-z.]+: |`spec\.[A-Za-z.]+: /,
    'the field as the form labels it',
  ],
  ['"Help" for the Guide', /label: 'Help'|>\s*Help\s*</, 'Guide'],
  ['"valuation" on a screen', /<th[^>]*>\s*Valuation\s*</, 'lowest exponent'],
  [
    '"N max" or "Class table up to N" as a label',
    /N max\b|Class table up to N/,
    'N_max / class-table depth',
  ],
];

describe('one vocabulary', () => {
  it('reads the client templates, server messages, renderers and the Guide', () => {
    expect(SOURCES.some((f) => f.endsWith('.html'))).toBe(true);
    expect(SOURCES.some((f) => f.startsWith('docs/'))).toBe(true);
  });

  it.each(BANNED)('no %s (%s; use %s)', (_, pattern) => {
    const hits: string[] = [];
    for (const file of SOURCES) {
      const lines = readFileSync(join(root, file), 'utf8').split('\n');
      lines.forEach((line, i) => {
        if (pattern.test(line))
          hits.push(`${relative(root, join(root, file))}:${i + 1}: ${line.trim()}`);
      });
    }
    expect(hits).toEqual([]);
  });

  it('finds a banned variant where one is written (the patterns can fail)', () => {
    const samples = [
      'DIFFERS: the routes',
      'expected ${m.expected}, found ${m.found}',
      'agrees to O(q^4)',
      "c.status === 'red'",
      '<mat-icon aria-hidden="true">close</mat-icon>',
      "'spec.nMax: is too big'",
      "{ id: 'help', label: 'Help' }",
      '<th scope="col">Valuation</th>',
      '<mat-label>N max</mat-label>',
    ];
    BANNED.forEach(([, pattern], i) => expect(pattern.test(samples[i]!)).toBe(true));
  });
});
