/** A run of plain text, or a web address found in the text. */
export type TextSegment =
  | { kind: 'text'; text: string; start: number }
  | { kind: 'link'; text: string; href: string; start: number };

/** http(s) addresses up to the next whitespace or character that cannot end a bare URL. */
const URL_PATTERN = /https?:\/\/[^\s<>"'`]+/gi;

/** Characters that end a sentence around a URL rather than belong to it. */
const TRAILING_PUNCTUATION = /[.,;:!?'"]+$/;

/**
 * Splits `text` into plain runs and http(s) links, so a template can show links as <a> elements
 * and everything else as text (never as HTML). Sentence punctuation after a URL, and a closing
 * bracket without a matching opening one, stay outside the link. `start` is the segment's
 * offset in `text`, a stable key for rendering.
 */
export function splitLinks(text: string): TextSegment[] {
  const segments: TextSegment[] = [];
  let cursor = 0;
  for (const match of text.matchAll(URL_PATTERN)) {
    const start = match.index;
    const url = trimUrl(match[0]);
    if (!/^https?:\/\/[^/?#]/i.test(url)) continue;
    if (start > cursor)
      segments.push({ kind: 'text', text: text.slice(cursor, start), start: cursor });
    segments.push({ kind: 'link', text: url, href: url, start });
    cursor = start + url.length;
  }
  if (cursor < text.length)
    segments.push({ kind: 'text', text: text.slice(cursor), start: cursor });
  return mergeText(segments);
}

function trimUrl(candidate: string): string {
  let url = candidate;
  for (;;) {
    const trimmed = url.replace(TRAILING_PUNCTUATION, '');
    const unbalanced = trimmed.endsWith(')') && count(trimmed, '(') < count(trimmed, ')');
    const next = unbalanced ? trimmed.slice(0, -1) : trimmed;
    if (next === url) return url;
    url = next;
  }
}

function count(text: string, char: string): number {
  return text.split(char).length - 1;
}

/** Joins neighbouring text runs (left when a match was rejected). */
function mergeText(segments: TextSegment[]): TextSegment[] {
  const merged: TextSegment[] = [];
  for (const segment of segments) {
    const last = merged[merged.length - 1];
    if (last?.kind === 'text' && segment.kind === 'text') {
      merged[merged.length - 1] = { ...last, text: last.text + segment.text };
    } else {
      merged.push(segment);
    }
  }
  return merged;
}
