// Import and export in the browser. ImportButton goes on the workbook list (new workbook) or in an
// open workbook (workbookId: adds sheets); ExportMenu goes in the workbook's toolbar.
export { ExportMenu } from './ExportMenu.js';
export { ImportButton } from './ImportButton.js';
export { uploadSpreadsheet, type UploadProgress } from './upload.js';
