import { type TextSegment, splitLinks } from './link-segments';

/** Shorthand for the expected segments: strings are text, [url] is a link. */
function expected(...parts: (string | [string])[]): TextSegment[] {
  let start = 0;
  return parts.map((part) => {
    const segment: TextSegment =
      typeof part === 'string'
        ? { kind: 'text', text: part, start }
        : { kind: 'link', text: part[0], href: part[0], start };
    start += segment.text.length;
    return segment;
  });
}

describe('splitLinks', () => {
  it.each<[string, string, TextSegment[]]>([
    ['empty text', '', []],
    ['text without links', 'Hello there', expected('Hello there')],
    ['a lone link', 'https://cellsmith.test/a', expected(['https://cellsmith.test/a'])],
    [
      'a link inside text',
      'Open http://localhost:4000/invitations/abc_123 to join.',
      expected('Open ', ['http://localhost:4000/invitations/abc_123'], ' to join.'),
    ],
    [
      'sentence punctuation after a link',
      'See https://a.test/x?y=1&z=2.',
      expected('See ', ['https://a.test/x?y=1&z=2'], '.'),
    ],
    [
      'a closing bracket that belongs to the sentence',
      '(see https://a.test/page)',
      expected('(see ', ['https://a.test/page'], ')'),
    ],
    [
      'a bracket pair inside the URL',
      'https://a.test/wiki/VE_(table) ok',
      expected(['https://a.test/wiki/VE_(table)'], ' ok'),
    ],
    [
      'two links on separate lines',
      'A: https://a.test\nB: https://b.test',
      expected('A: ', ['https://a.test'], '\nB: ', ['https://b.test']),
    ],
    ['a scheme with no host', 'broken https:// here', expected('broken https:// here')],
    [
      'other schemes',
      'javascript:alert(1) ftp://x.test',
      expected('javascript:alert(1) ftp://x.test'),
    ],
    [
      'a URL that would break out of markup',
      'x https://a.test/"onmouseover=1',
      expected('x ', ['https://a.test/'], '"onmouseover=1'),
    ],
  ])('handles %s', (_name, text, segments) => {
    expect(splitLinks(text)).toEqual(segments);
  });
});
