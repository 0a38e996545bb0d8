// One colour per colleague, the same on every screen that shows where they are (the grid's marks,
// the team panel): picked from the user id, so it does not change between visits or browsers.
// Hues spaced around the wheel, dark enough for white text on them in both themes.
const palette = ['#0f766e', '#b45309', '#7c3aed', '#be123c', '#1d4ed8', '#4d7c0f', '#a21caf', '#0e7490'] as const;

export function presenceColour(userId: string): string {
  let h = 0;
  for (let i = 0; i < userId.length; i++) h = (h * 31 + userId.charCodeAt(i)) >>> 0;
  return palette[h % palette.length];
}
