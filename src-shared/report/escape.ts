/** Escaping of text for HTML and XML: every string that came from a data file goes through this. */
const ENTITIES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ENTITIES[c]);
}

/**
 * Checks that an SVG string holds only drawing: no script, no event-handler
 * attribute, no embedded HTML, no link to anything outside the file.
 * Returns the reason it is refused, or null when it is safe to inline.
 */
export function unsafeSvgReason(svg: string): string | null {
  if (!/^\s*(<\?xml[^>]*>\s*)?<svg[\s>]/i.test(svg)) return 'it does not start with an <svg> element';
  // Text content has its < escaped, so every "<" opens a real tag: look at the tags only.
  for (const [tag] of svg.matchAll(/<[^>]*>/g)) {
    if (/^<\/?\s*script/i.test(tag)) return 'it holds a script';
    if (/^<\/?\s*foreignObject/i.test(tag)) return 'it embeds HTML';
    if (/\son[a-z]+\s*=/i.test(tag)) return 'it has an event-handler attribute';
    if (/(href|src)\s*=\s*["']\s*(?!#|data:image\/)/i.test(tag)) return 'it links to content outside the file';
  }
  return null;
}
