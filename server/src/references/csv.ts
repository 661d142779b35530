/**
 * Splits CSV text into records of fields (RFC 4180: comma-separated, fields may be quoted with
 * `"`, a quote inside a quoted field is doubled, quoted fields may hold commas and newlines).
 * Each record carries the 1-based line it starts on. Throws `{line, message}` on an unclosed
 * quote or text after a closing quote.
 */
export function parseCsv(text: string): Array<{ line: number; fields: string[] }> {
  const records: Array<{ line: number; fields: string[] }> = [];
  let fields: string[] = [];
  let field = '';
  let line = 1;
  let startLine = 1;
  let i = 0;
  let quoted = false;
  let afterQuote = false;
  const endRecord = () => {
    fields.push(field);
    if (!(fields.length === 1 && fields[0]!.trim() === ''))
      records.push({ line: startLine, fields });
    fields = [];
    field = '';
    afterQuote = false;
    startLine = line;
  };
  while (i < text.length) {
    const c = text[i]!;
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        field += '"';
        i += 2;
        continue;
      }
      if (c === '"') {
        quoted = false;
        afterQuote = true;
      } else {
        if (c === '\n') line += 1;
        field += c;
      }
      i += 1;
      continue;
    }
    if (c === ',') {
      fields.push(field);
      field = '';
      afterQuote = false;
    } else if (c === '\n' || c === '\r') {
      if (c === '\r' && text[i + 1] === '\n') i += 1;
      line += 1;
      endRecord();
    } else if (c === '"' && field.trim() === '' && !afterQuote) {
      quoted = true;
      field = '';
    } else if (afterQuote && c.trim() !== '') {
      throw { line, message: 'text after a closing quote' };
    } else if (!afterQuote) {
      field += c;
    }
    i += 1;
  }
  if (quoted) throw { line: startLine, message: 'a quoted field is never closed' };
  if (field !== '' || fields.length > 0) endRecord();
  return records;
}
