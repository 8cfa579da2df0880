/**
 * Core tags each figure with where it comes from — [PUB] / [PUB-2] a published source named beside
 * it, [CP] common practice, [MEM] recalled without a source. On screen the named source is enough
 * for the first; the other two are said in words.
 */
export function readableSource(text: string | null | undefined): string {
  return (text ?? '')
    .replace(/\s*(?:via\s+)?\[PUB(?:-\d+)?\]/g, '')
    .replace(/\[CP\]/g, '(common practice)')
    .replace(/\[MEM\]/g, '(from memory, no source)')
    .replace(/\s+([,.;)])/g, '$1')
    .trim();
}
