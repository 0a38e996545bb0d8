// The first rows of a workbook, drawn by the page's first script as soon as GET …/first-rows answers
// with the values stored for them: before React, the router and the workbook screen's code have
// arrived, which on the 2-core box took another half second (bench/browser-open.ts). Drawn over the
// page in the app's own frame, read-only, and taken away by the workbook screen in the same frame as
// it draws its own first rows, its session or an error (WorkbookPage.tsx), or by the router when the
// page goes elsewhere (router.tsx, RouteError.tsx). Plain DOM and no engine code: main.tsx's script
// stays a few kilobytes.
import type { FirstRowsPayload } from '@shared/workbooks.js';
import { browserStorage, glanceOf } from '../core/workbook/session/glance.js';
import { drawPreview, el, previewFrameClass } from '../features/grid/previewDom.js';
import { markSvg } from '../components/ui/markShapes.js';
import { appBarClass, appFrameClass, appMainClass, brandClass, navItemClass, navListClass } from './layout/appBar.js';

let state: 'waiting' | 'shown' | 'ended' = 'waiting';
let drawn: HTMLElement | null = null;

/**
 * Draws the glance of these first rows over the page, unless one was drawn or taken away already, or
 * they have no stored values or unsent changes wait for the workbook (glanceOf). True when drawn.
 */
export function showEarlyGlance(first: FirstRowsPayload): boolean {
  if (state !== 'waiting' || !document.body) return false;
  const glance = glanceOf(first, browserStorage());
  if (!glance) return false;
  const frame = el('div', `${appFrameClass} fixed inset-0 z-50`);
  frame.dataset.glance = 'true';
  frame.setAttribute('aria-busy', 'true');
  const bar = el('header', appBarClass);
  const brand = el('span', brandClass, 'Orbitab');
  brand.prepend(markSvg());
  const nav = el('nav', navListClass);
  nav.setAttribute('aria-label', 'Main');
  nav.append(el('span', navItemClass(true), 'Workbooks'), el('span', navItemClass(false), 'Functions'));
  bar.append(brand, nav);
  const main = el('main', appMainClass);
  const preview = el('div', previewFrameClass);
  drawPreview(preview, glance);
  main.append(preview);
  frame.append(bar, main);
  document.body.append(frame);
  drawn = frame;
  state = 'shown';
  return true;
}

/** Takes the glance away (at once, in the caller's frame), and keeps one from being drawn later. */
export function endEarlyGlance(): void {
  state = 'ended';
  drawn?.remove();
  drawn = null;
}
