// The app's frame and top bar, as classes: drawn by AppLayout.tsx and, before React is in, by the
// page's first script around the first rows it draws (src/app/earlyGlance.ts), so the two line up.

export const appFrameClass = 'flex h-screen flex-col bg-canvas text-ink';
export const appBarClass = 'flex h-10 shrink-0 items-center gap-4 border-b border-line bg-surface px-3';
export const brandClass = 'flex items-center gap-1.5 rounded-ctl pr-1 text-ui font-semibold tracking-tight text-ink';
export const navListClass = 'flex items-center gap-0.5';
export const navItemClass = (active: boolean) =>
  `flex h-7 items-center rounded-ctl px-2.5 text-ui font-medium ${active ? 'bg-accent-soft text-accent' : 'text-ink-2 hover:bg-hover hover:text-ink'}`;
export const appMainClass = 'min-h-0 flex-1 overflow-auto';
