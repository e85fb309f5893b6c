import type { Locator, Page } from 'playwright-core';

/**
 * What a look-and-feel check reads from the page: horizontal overflow of
 * the page and of the stage, elements that stick out past the stage's right
 * edge without a scroll box of their own (cut-off text), the element that
 * has the keyboard focus, and whether that focus can be seen.
 */
export interface Overflow {
  page: { scrollWidth: number; clientWidth: number };
  stage: { scrollWidth: number; clientWidth: number };
  /** Elements past the stage's right edge that no scroll box of theirs holds. */
  cutOff: string[];
}

export function overflowOf(page: Page): Promise<Overflow> {
  return page.evaluate(() => {
    const doc = document.documentElement;
    const stage = document.getElementById('workspace')!;
    const edge = stage.getBoundingClientRect().right;
    const scrolls = (el: Element) => ['auto', 'scroll', 'hidden', 'clip'].includes(getComputedStyle(el).overflowX);
    const cutOff: string[] = [];
    for (const el of stage.querySelectorAll('*')) {
      const r = el.getBoundingClientRect();
      if (r.width === 0 || r.right <= edge + 1) continue;
      let held = false;
      for (let p = el.parentElement; p && p !== stage; p = p.parentElement) if (scrolls(p)) held = true;
      if (!held) cutOff.push(`${el.tagName.toLowerCase()}.${[...el.classList].join('.')} "${(el.textContent ?? '').trim().slice(0, 40)}" right ${Math.round(r.right)} > ${Math.round(edge)}`);
    }
    return { page: { scrollWidth: doc.scrollWidth, clientWidth: doc.clientWidth }, stage: { scrollWidth: stage.scrollWidth, clientWidth: stage.clientWidth }, cutOff: cutOff.slice(0, 10) };
  });
}

export interface Focused {
  /** The accessible-ish name: aria-label, else the label or text, else the test id. */
  name: string;
  tag: string;
  /** An outline or a box-shadow is drawn around it. */
  ringed: boolean;
  /** Inside the viewport. */
  inView: boolean;
}

export function focusedOf(page: Page): Promise<Focused> {
  return page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return { name: '', tag: 'body', ringed: false, inView: false };
    const style = getComputedStyle(el);
    const outline = style.outlineStyle !== 'none' && parseFloat(style.outlineWidth) > 0;
    const shadow = style.boxShadow !== 'none' && style.boxShadow !== '';
    const label = el.id ? document.querySelector(`label[for="${el.id}"]`)?.textContent : el.closest('label')?.textContent;
    const name = (el.getAttribute('aria-label') ?? label ?? el.textContent ?? el.getAttribute('data-testid') ?? '').replace(/\s+/g, ' ').trim();
    const r = el.getBoundingClientRect();
    return { name, tag: el.tagName.toLowerCase(), ringed: outline || shadow, inView: r.bottom > 0 && r.top < innerHeight && r.right > 0 && r.left < innerWidth };
  });
}

/** Presses Tab up to `limit` times and returns what took the focus each time. */
export async function tabThrough(page: Page, limit: number): Promise<Focused[]> {
  const seen: Focused[] = [];
  for (let i = 0; i < limit; i++) {
    await page.keyboard.press('Tab');
    seen.push(await focusedOf(page));
  }
  return seen;
}

/** Tabs until the focus lands on an element whose name matches, failing after `limit` presses. */
export async function tabTo(page: Page, name: RegExp, limit = 80): Promise<Focused> {
  for (let i = 0; i < limit; i++) {
    await page.keyboard.press('Tab');
    const f = await focusedOf(page);
    if (name.test(f.name)) return f;
  }
  throw new Error(`Tab did not reach ${name} in ${limit} presses`);
}

/** The element is drawn inside the viewport (its top part at least). */
export async function inViewport(page: Page, target: Locator): Promise<boolean> {
  const box = await target.boundingBox();
  const view = page.viewportSize();
  return !!box && !!view && box.width > 0 && box.height > 0 && box.y >= 0 && box.y < view.height && box.x >= 0 && box.x + box.width <= view.width + 1;
}
