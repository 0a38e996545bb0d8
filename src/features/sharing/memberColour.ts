// Each member's own colour on the team board and beside their position: picked from the member's
// id, so it stays the same on every page and for every colleague.
const hues = [200, 28, 152, 280, 340, 96, 236, 12];

export function memberHue(userId: string): number {
  let h = 0;
  for (let i = 0; i < userId.length; i++) h = (h * 31 + userId.charCodeAt(i)) >>> 0;
  return hues[h % hues.length];
}

export const memberColour = (userId: string) => `hsl(${memberHue(userId)} 55% 42%)`;
