import { describe, expect, it } from 'vitest';
import { logLink } from '@shared/engine/links/log';
import { logitLink } from '@shared/engine/links/logit';
import type { Link } from '@shared/engine/links/types';

// Property tests (common practice): g(g^-1(eta)) = eta, and d mu / d eta
// equals a central finite difference of g^-1.
function checkLink(link: Link, etas: number[]) {
  for (const eta of etas) {
    expect(link.linkfun(link.linkinv(eta))).toBeCloseTo(eta, 9);
    const h = 1e-5 * Math.max(1, Math.abs(eta));
    const fd = (link.linkinv(eta + h) - link.linkinv(eta - h)) / (2 * h);
    expect(Math.abs(link.muEta(eta) - fd)).toBeLessThan(1e-7 * Math.max(1, Math.abs(fd)));
  }
}

describe('links', () => {
  const etas = Array.from({ length: 41 }, (_, i) => -10 + i * 0.5);
  it('log link inverts and its derivative matches finite differences', () => checkLink(logLink, etas));
  it('logit link inverts and its derivative matches finite differences', () => checkLink(logitLink, etas.filter((e) => Math.abs(e) <= 8)));
  it('log link keeps mu positive for very negative eta', () => {
    expect(logLink.linkinv(-1000)).toBeGreaterThan(0);
    expect(Number.isFinite(logLink.linkfun(logLink.linkinv(-1000)))).toBe(true);
  });
  it('logit link keeps mu inside (0, 1)', () => {
    expect(logitLink.linkinv(800)).toBeLessThan(1);
    expect(logitLink.linkinv(-800)).toBeGreaterThan(0);
  });
});
