// Orbitab's mark (a rounded square, an orbit, a nucleus) as data: drawn by OrbitabMark (icons.tsx) and,
// before React is in, by the page's first script (src/app/earlyGlance.ts).

export interface MarkShape {
  tag: 'rect' | 'ellipse' | 'circle';
  /** Attributes in React's spelling (strokeWidth); markSvg writes them as SVG's (stroke-width). */
  attrs: Record<string, string>;
}

export const orbitabMarkShapes: readonly MarkShape[] = [
  { tag: 'rect', attrs: { width: '16', height: '16', rx: '3.5', fill: 'var(--color-accent)' } },
  { tag: 'ellipse', attrs: { cx: '8', cy: '8', rx: '5.3', ry: '2.4', fill: 'none', stroke: 'var(--color-on-accent)', strokeWidth: '1.3', transform: 'rotate(-30 8 8)' } },
  { tag: 'circle', attrs: { cx: '8', cy: '8', r: '1.6', fill: 'var(--color-on-accent)' } },
];

/** The mark as an SVG element, `size` pixels square. */
export function markSvg(size = 18): SVGSVGElement {
  const ns = 'http://www.w3.org/2000/svg';
  const svg = document.createElementNS(ns, 'svg');
  for (const [k, v] of Object.entries({ viewBox: '0 0 16 16', width: String(size), height: String(size), 'aria-hidden': 'true' })) svg.setAttribute(k, v);
  for (const { tag, attrs } of orbitabMarkShapes) {
    const shape = document.createElementNS(ns, tag);
    for (const [k, v] of Object.entries(attrs)) shape.setAttribute(k.replace(/[A-Z]/g, (m) => `-${m.toLowerCase()}`), v);
    svg.append(shape);
  }
  return svg;
}
