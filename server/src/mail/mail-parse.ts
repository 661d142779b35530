import type { MailboxMessageDto } from '@traceloom/shared/api';
/** Decodes RFC 2047 encoded words (`=?utf-8?Q?...?=`, `=?utf-8?B?...?=`) in a header value. */
export function decodeWords(value: string): string {
  const decoded = value.replace(
    /=\?([^?]+)\?([QqBb])\?([^?]*)\?=(\s+(?==\?))?/g,
    (_all, _charset: string, encoding: string, data: string) => {
      if (encoding.toUpperCase() === 'B') return Buffer.from(data, 'base64').toString('utf8');
      const bytes = data
        .replace(/_/g, ' ')
        .replace(/=([0-9A-Fa-f]{2})/g, (_m, hex: string) => String.fromCharCode(parseInt(hex, 16)));
      return Buffer.from(bytes, 'latin1').toString('utf8');
    },
  );
  return decoded;
}

function decodeBody(body: string, encoding: string): string {
  switch (encoding.toLowerCase()) {
    case 'base64':
      return Buffer.from(body.replace(/\s+/g, ''), 'base64').toString('utf8');
    case 'quoted-printable': {
      const bytes = body
        .replace(/=\r?\n/g, '')
        .replace(/=([0-9A-Fa-f]{2})/g, (_m, hex: string) => String.fromCharCode(parseInt(hex, 16)));
      return Buffer.from(bytes, 'latin1').toString('utf8');
    }
    default:
      return body;
  }
}

/**
 * Splits a raw RFC 5322 message into unfolded, decoded headers and its text body. Enough for
 * the single-part text messages Traceloom itself sends (7bit, quoted-printable or base64); a
 * multipart body is kept as it arrived.
 */
export function parseMessage(
  raw: string,
): Pick<MailboxMessageDto, 'headers' | 'subject' | 'from' | 'to' | 'text'> {
  const split = raw.search(/\r?\n\r?\n/);
  const head = split < 0 ? raw : raw.slice(0, split);
  const body = split < 0 ? '' : raw.slice(split).replace(/^\r?\n\r?\n/, '');
  const headers: Array<[string, string]> = [];
  for (const line of head.split(/\r?\n/)) {
    if (/^[ \t]/.test(line) && headers.length > 0) {
      headers[headers.length - 1]![1] += ` ${line.trim()}`;
    } else {
      const colon = line.indexOf(':');
      if (colon > 0)
        headers.push([line.slice(0, colon).trim().toLowerCase(), line.slice(colon + 1).trim()]);
    }
  }
  for (const header of headers) header[1] = decodeWords(header[1]);
  const get = (name: string) => headers.find(([n]) => n === name)?.[1] ?? '';
  return {
    headers,
    subject: get('subject'),
    from: get('from'),
    to: get('to'),
    text: decodeBody(body, get('content-transfer-encoding') || '7bit').replace(/\r\n/g, '\n'),
  };
}
