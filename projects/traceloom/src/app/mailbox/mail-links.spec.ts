import { mailParts } from './mail-links';

describe('mailParts', () => {
  it.each([
    ['no address here', [{ text: 'no address here' }]],
    [
      'Open http://localhost:4300/datasets/7a.\nThanks',
      [
        { text: 'Open ' },
        { text: 'http://localhost:4300/datasets/7a', href: 'http://localhost:4300/datasets/7a' },
        { text: '.\nThanks' },
      ],
    ],
    [
      '(see https://example.test/a?b=1&c=2)',
      [
        { text: '(see ' },
        { text: 'https://example.test/a?b=1&c=2', href: 'https://example.test/a?b=1&c=2' },
        { text: ')' },
      ],
    ],
    ['javascript:alert(1) ftp://x', [{ text: 'javascript:alert(1) ftp://x' }]],
  ])('%j', (text, parts) => {
    expect(mailParts(text)).toEqual(parts);
    expect(
      mailParts(text)
        .map((p) => p.text)
        .join(''),
    ).toBe(text);
  });
});
