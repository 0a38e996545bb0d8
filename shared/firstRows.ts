// How much of a sheet the first screen shows, and so what GET …/first-rows answers with. A module of its
// own (shared/workbooks.ts builds its request schemas as it loads): the page's first script reads these.

/** Rows and columns of a sheet the first screen shows, and so those GET …/first-rows answers with. */
export const firstRowsShown = 60;
export const firstColsShown = 64;
