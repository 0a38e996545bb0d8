// The API path of a workbook or one of its parts, in a module of its own: the page's first script asks
// for the workbook with it before the schemas in workbooks.ts are loaded (src/app/earlyStart.ts).
/**
 * The address of a workbook, or of something under it, as the API and the client's routes both write
 * it: workbookPath(id, 'sheets', sheetId) → /workbooks/<id>/sheets/<sheetId>, every segment
 * URI-encoded. API calls put /api in front; a query string goes after.
 */
export function workbookPath(id: string, ...rest: (string | number)[]): string {
  return ['/workbooks', ...[id, ...rest].map((segment) => encodeURIComponent(segment))].join('/');
}
