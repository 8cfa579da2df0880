import type { ReactNode } from 'react';

const URL_PATTERN = /https?:\/\/[^\s<>"']+/g;
const TRAILING_PUNCTUATION = /[.,;:!?)\]]+$/;

/** Turns the web addresses in plain text into links; everything else stays text. */
export function linkify(text: string, linkClassName?: string): ReactNode[] {
  const parts: ReactNode[] = [];
  let last = 0;
  for (const match of text.matchAll(URL_PATTERN)) {
    const start = match.index;
    let url = match[0];
    const trailing = TRAILING_PUNCTUATION.exec(url)?.[0] ?? '';
    if (trailing) url = url.slice(0, -trailing.length);
    if (start > last) parts.push(text.slice(last, start));
    parts.push(
      <a key={`${start}-${url}`} href={url} className={linkClassName}>
        {url}
      </a>,
    );
    last = start + url.length;
  }
  if (last < text.length) parts.push(text.slice(last));
  return parts;
}
