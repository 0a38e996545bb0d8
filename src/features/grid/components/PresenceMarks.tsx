// Where colleagues are on this sheet: the cell each one is on, ringed in their colour with their
// first name on a tab above it. Drawn inside the grid's scrolling content (beside the library's own
// selection box), so the marks scroll with the cells and need no per-cell work.
import { useEffect, useState, type RefObject } from 'react';
import { createPortal } from 'react-dom';
import { defaultColumnWidthPx } from '../../../core/workbook/model/displaySettings.js';

export interface PresenceMark {
  userId: string;
  name: string;
  colour: string;
  /** View row and column. */
  row: number;
  col: number;
  /** The A1 address, for the words read out. */
  address: string;
}

export function PresenceMarks({ box, marks, widths, headerHeight, rowHeight, gutterWidth }: { box: RefObject<HTMLElement | null>; marks: PresenceMark[]; widths: Record<number, number>; headerHeight: number; rowHeight: number; gutterWidth: number }) {
  const [host, setHost] = useState<HTMLElement | null>(null);
  useEffect(() => {
    // The grid's content element, found once it is drawn (looked up again as marks change).
    setHost(box.current?.querySelector<HTMLElement>('.dsg-container > div') ?? null);
  }, [box, marks]);
  if (!host || marks.length === 0) return null;
  const left = (col: number) => {
    let x = gutterWidth;
    for (let c = 0; c < col; c++) x += widths[c] ?? defaultColumnWidthPx;
    return x;
  };
  return createPortal(
    <div aria-label="Colleagues on this sheet" role="list" className="pointer-events-none">
      {marks.map((m) => (
        <div
          key={m.userId}
          role="listitem"
          aria-label={`${m.name} is on ${m.address}`}
          data-testid="presence-mark"
          className="absolute z-[5] rounded-[2px]"
          style={{ left: left(m.col), top: headerHeight + m.row * rowHeight, width: widths[m.col] ?? defaultColumnWidthPx, height: rowHeight, boxShadow: `inset 0 0 0 2px ${m.colour}` }}
        >
          <span className={`absolute right-0 px-1 text-[10px] leading-[14px] font-semibold whitespace-nowrap text-white ${m.row === 0 ? 'top-full rounded-b-[3px]' : '-top-3.5 rounded-t-[3px]'}`} style={{ background: m.colour }}>
            {m.name.split(/\s+/)[0]}
          </span>
        </div>
      ))}
    </div>,
    host,
  );
}
