/** XML text unescaping: the five entities, numeric references, and the _xHHHH_ escapes OOXML uses for control characters. */
const named: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };

export function unescapeXml(s: string): string {
  let out = s;
  if (out.indexOf('&') >= 0) {
    out = out.replace(/&(#x[0-9a-fA-F]+|#\d+|amp|lt|gt|quot|apos);/g, (_, e: string) => {
      if (e[0] !== '#') return named[e];
      const code = e[1] === 'x' ? parseInt(e.slice(2), 16) : parseInt(e.slice(1), 10);
      return String.fromCodePoint(code);
    });
  }
  return unescapeOoxml(out);
}

/** _x000D_ -> carriage return (ECMA-376 ST_Xstring). */
export function unescapeOoxml(s: string): string {
  if (s.indexOf('_x') < 0) return s;
  return s.replace(/_x([0-9A-Fa-f]{4})_/g, (_, h: string) => String.fromCharCode(parseInt(h, 16)));
}
