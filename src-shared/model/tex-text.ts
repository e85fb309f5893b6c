/**
 * Names from data files (column and level names) made safe inside TeX's
 * \text{...}: every character TeX gives a meaning is written as its text
 * command, so a name can neither break the equation nor inject markup.
 */
const textEscapes: Record<string, string> = {
  '\\': '\\textbackslash{}',
  '{': '\\{',
  '}': '\\}',
  $: '\\$',
  '&': '\\&',
  '#': '\\#',
  '^': '\\textasciicircum{}',
  _: '\\_',
  '%': '\\%',
  '~': '\\textasciitilde{}',
};

export function escapeTexText(s: string): string {
  return s.replace(/[\\{}$&#^_%~]/g, (c) => textEscapes[c]);
}

/** A name set upright as text inside math: \text{habitat}. */
export function texName(s: string): string {
  return `\\text{${escapeTexText(s)}}`;
}

/** A piece of a mixed line: words to show as text, or TeX to typeset. */
export type TexSegment = { readonly text: string } | { readonly tex: string };

const unescapes: Record<string, string> = Object.fromEntries(Object.entries(textEscapes).map(([c, e]) => [e, c]));

function unescapeTexText(s: string): string {
  return s.replace(/\\textbackslash\{\}|\\textasciicircum\{\}|\\textasciitilde\{\}|\\[{}$&#_%]/g, (e) => unescapes[e]);
}

/**
 * Splits a line at its top-level \text{...} groups, so a screen can set the
 * words as ordinary wrapping text and typeset only the math between them.
 * The inverse of `words`/`texName` for the text they wrote.
 */
export function texSegments(tex: string): TexSegment[] {
  const out: TexSegment[] = [];
  const push = (s: TexSegment) => {
    const last = out[out.length - 1];
    if ('text' in s && last && 'text' in last) out[out.length - 1] = { text: last.text + s.text };
    else if (('text' in s ? s.text : s.tex.trim()) !== '') out.push(s);
  };
  let i = 0;
  let mathStart = 0;
  let depth = 0;
  while (i < tex.length) {
    const c = tex[i];
    if (c === '\\' && depth === 0 && tex.startsWith('\\text{', i)) {
      let j = i + 6;
      let d = 1;
      while (j < tex.length && d > 0) {
        if (tex[j] === '\\') j += 2;
        else {
          if (tex[j] === '{') d++;
          else if (tex[j] === '}') d--;
          j++;
        }
      }
      push({ tex: tex.slice(mathStart, i) });
      push({ text: unescapeTexText(tex.slice(i + 6, j - 1)) });
      i = j;
      mathStart = j;
      continue;
    }
    if (c === '\\') i += 2;
    else {
      if (c === '{') depth++;
      else if (c === '}') depth--;
      i++;
    }
  }
  push({ tex: tex.slice(mathStart) });
  return out;
}
