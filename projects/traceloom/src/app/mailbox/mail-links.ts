/** A piece of a mail's text: plain text, or a web address to show as a link. */
export type MailPart = { text: string; href?: undefined } | { text: string; href: string };

/** http(s) addresses up to the next white space; trailing punctuation stays text. */
const ADDRESS = /https?:\/\/[^\s<>"]+/g;
const TRAILING = /[.,;:!?)\]'»”]+$/;

/**
 * Splits a plain-text mail into text and web addresses, so the mailbox can show each address
 * as a link (only http and https; a sentence's final full stop is not part of the address).
 */
export function mailParts(text: string): MailPart[] {
  const out: MailPart[] = [];
  let last = 0;
  for (const match of text.matchAll(ADDRESS)) {
    const address = match[0].replace(TRAILING, '');
    const start = match.index;
    if (start > last) out.push({ text: text.slice(last, start) });
    out.push({ text: address, href: address });
    last = start + address.length;
  }
  if (last < text.length) out.push({ text: text.slice(last) });
  return out;
}
