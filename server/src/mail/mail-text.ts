/**
 * One line of header-safe text: CR, LF, the Unicode line and paragraph separators and every
 * other control character become a space or vanish, so a display name or subject can never
 * start a header of its own (OWASP ASVS 5, V1.2: injection through e-mail headers).
 */
export function oneLine(text: string, max = 200): string {
  return (
    text
      .replace(/[\r\n\u2028\u2029]+/g, ' ')
      // eslint-disable-next-line no-control-regex -- removing control characters is the point
      .replace(/[\u0000-\u001f\u007f]/g, '')
      .replace(/\s{2,}/g, ' ')
      .trim()
      .slice(0, max)
  );
}
