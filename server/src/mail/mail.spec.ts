import { describe, expect, it } from 'vitest';
import { decodeWords, parseMessage } from './mail-parse.js';
import { oneLine } from './mail-text.js';

describe('oneLine', () => {
  it.each([
    ['Eve\r\nBcc: a@b.test', 'Eve Bcc: a@b.test'],
    ['a\rb\nc', 'a b c'],
    ['tab\there', 'tabhere'],
    ['line\u2028sep', 'line sep'],
    ['  spaced   out  ', 'spaced out'],
  ])('%j -> %j', (input, expected) => {
    expect(oneLine(input)).toBe(expected);
  });
});

describe('parseMessage', () => {
  it('unfolds headers, decodes RFC 2047 words and a quoted-printable body', () => {
    // RFC 2047 section 8 example words (=?ISO-8859-1?Q?a?= decodes to "a"); UTF-8 here.
    const raw =
      'From: Traceloom <t@localhost>\r\nSubject: =?UTF-8?Q?Gr=C3=BC=C3=9Fe?=\r\n  aus Graz\r\n' +
      'Content-Transfer-Encoding: quoted-printable\r\n\r\nZ(2) =3D q + =\r\nq^2\r\n';
    const m = parseMessage(raw);
    expect(m.subject).toBe('Grüße aus Graz');
    expect(m.headers.map(([name]) => name)).toEqual([
      'from',
      'subject',
      'content-transfer-encoding',
    ]);
    expect(m.text).toBe('Z(2) = q + q^2\n');
  });

  it('decodes base64 words', () => {
    expect(decodeWords('=?utf-8?B?w6lsw6h2ZQ==?=')).toBe('élève');
  });
});
