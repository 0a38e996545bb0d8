// A small menu at the pointer (right-click): a list of actions, separators between groups, each
// action with its key and, when it cannot be used, the reason on hover. Esc, a click elsewhere or
// choosing an action closes it; arrows move between actions.
import { useEffect, useLayoutEffect, useRef, useState } from 'react';
import { createPortal } from 'react-dom';

export interface MenuAction {
  label: string;
  run: () => void;
  keys?: string;
  /** Why it cannot be used now (the action is shown greyed with this on hover). */
  unavailable?: string | null;
}

/** Groups of actions, drawn with a thin line between groups. */
export type MenuGroups = MenuAction[][];

export function ContextMenu({ at, label, groups, onClose }: { at: { x: number; y: number }; label: string; groups: MenuGroups; onClose: () => void }) {
  const box = useRef<HTMLDivElement>(null);
  const [pos, setPos] = useState(at);
  useLayoutEffect(() => {
    // Kept inside the window: opened near the right or bottom edge it opens leftwards or upwards.
    const r = box.current?.getBoundingClientRect();
    if (!r) return;
    setPos({ x: Math.max(4, Math.min(at.x, window.innerWidth - r.width - 4)), y: Math.max(4, Math.min(at.y, window.innerHeight - r.height - 4)) });
    box.current?.querySelector<HTMLButtonElement>('button:not([aria-disabled="true"])')?.focus();
  }, [at]);
  useEffect(() => {
    const away = (e: MouseEvent) => {
      if (!box.current?.contains(e.target as Node)) onClose();
    };
    const key = (e: KeyboardEvent) => {
      if (e.key === 'Escape') {
        e.preventDefault();
        e.stopPropagation();
        onClose();
      }
    };
    window.addEventListener('mousedown', away, true);
    window.addEventListener('keydown', key, true);
    window.addEventListener('blur', onClose);
    return () => {
      window.removeEventListener('mousedown', away, true);
      window.removeEventListener('keydown', key, true);
      window.removeEventListener('blur', onClose);
    };
  }, [onClose]);

  const move = (e: React.KeyboardEvent, step: number) => {
    const items = [...(box.current?.querySelectorAll<HTMLButtonElement>('button:not([aria-disabled="true"])') ?? [])];
    const i = items.indexOf(document.activeElement as HTMLButtonElement);
    items[(i + step + items.length) % items.length]?.focus();
    e.preventDefault();
  };

  return createPortal(
    <div
      ref={box}
      role="menu"
      aria-label={label}
      data-grid-shield=""
      onKeyDown={(e) => {
        e.stopPropagation();
        if (e.key === 'ArrowDown') move(e, 1);
        else if (e.key === 'ArrowUp') move(e, -1);
      }}
      onContextMenu={(e) => e.preventDefault()}
      // A click in the menu is not a click on the page: the sheet keeps its selection for the action.
      onMouseDown={(e) => e.stopPropagation()}
      className="fixed z-50 min-w-52 rounded-panel border border-line bg-surface py-1 text-ui shadow-lg"
      style={{ left: pos.x, top: pos.y }}
    >
      {groups
        .filter((g) => g.length > 0)
        .map((group, gi) => (
          <div key={gi} role="group" className={gi > 0 ? 'mt-1 border-t border-line pt-1' : undefined}>
            {group.map((a) => (
              <button
                key={a.label}
                type="button"
                role="menuitem"
                aria-disabled={a.unavailable ? true : undefined}
                title={a.unavailable ?? undefined}
                onMouseDown={(e) => e.preventDefault()}
                onClick={() => {
                  if (a.unavailable) return;
                  onClose();
                  a.run();
                }}
                className={`flex w-full items-center gap-6 px-3 py-1 text-left outline-none ${a.unavailable ? 'cursor-default text-ink-3' : 'text-ink hover:bg-accent-soft focus:bg-accent-soft'}`}
              >
                <span className="flex-1">{a.label}</span>
                {a.keys && <span className="font-mono text-caption text-ink-3">{a.keys}</span>}
              </button>
            ))}
          </div>
        ))}
    </div>,
    document.body,
  );
}
