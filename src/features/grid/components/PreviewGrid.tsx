// The first screenful of a large workbook, or of one opened on stored values, while its full engine is
// still being built: the same look as the grid, read-only, with a note that the rest is on its way.
// Drawn by previewDom.ts, which the page's first script also uses, so the two cannot differ.
import { useLayoutEffect, useRef } from 'react';
import { drawPreview, previewFrameClass, type PreviewFrame } from '../previewDom.js';

export function PreviewGrid({ title, preview, settings }: PreviewFrame) {
  const frame = useRef<HTMLDivElement>(null);
  useLayoutEffect(() => drawPreview(frame.current!, { title, preview, settings }), [title, preview, settings]);
  return <div ref={frame} className={previewFrameClass} />;
}
