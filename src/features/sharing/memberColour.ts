// Each member's colour on the team board (their dot, where they are now): by their place in the
// member list, so no two rows of one board share a colour while there are fewer than eight.
const hues = [200, 28, 152, 280, 340, 96, 236, 12];

export const memberColour = (place: number) => `hsl(${hues[place % hues.length]} 55% 42%)`;
