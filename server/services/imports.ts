// An uploaded spreadsheet becomes a workbook, or new sheets of one: read in a worker of the parse
// pool (server/xlsx/parseInWorker.ts), then stored in short steps into sheets no one sees until the
// last one (server/xlsx/importStaged.ts), so a large import neither holds the event loop nor leaves
// anything behind when it fails. The upload itself is received by the route.
import type { User } from 'lucia';
import { titleSchema } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { badRequest } from '../errors.js';
import { readAndImport } from '../xlsx/importStaged.js';
import { refusalAbout } from '../xlsx/limits.js';
import { sheetNameFromFilename } from '../xlsx/readCsv.js';
import type { ImportOutcome } from '../xlsx/importStore.js';
import { requireWorkbook } from './access.js';
import { shutdownRefusal } from './shutdown.js';

export interface UploadedFile {
  buffer: Buffer;
  originalname: string;
}

export type ImportResult = ImportOutcome & { workbookId: string };

/**
 * Imports `file` into the workbook `workbookId` (whose 'editSheets' right the access middleware has
 * checked) or, without one, into a new workbook titled after the file.
 */
export async function importUpload(ctx: AppContext, user: Pick<User, 'id' | 'siteRole'>, file: UploadedFile | undefined, workbookId: string | undefined): Promise<ImportResult> {
  const stopping = shutdownRefusal();
  if (stopping) throw stopping;
  if (!file) throw badRequest('file: required; send the spreadsheet as multipart/form-data in the field "file"');

  const title = titleSchema.safeParse(sheetNameFromFilename(file.originalname || '').replace(/_/g, ' '));
  const target = workbookId ? { workbookId } : { newWorkbook: { title: title.success ? title.data : 'Imported workbook' } };
  // Stored into a staging workbook as it is read; nothing shows until the last step.
  const outcome = await readAndImport(ctx, target, user.id, { buffer: file.buffer, filename: file.originalname || 'upload' }, {
    owner: user.id,
    stopReason: shutdownRefusal,
    // The read may take a while: the user must still be allowed to add sheets there when it is done.
    beforeFinish: () => {
      if (workbookId) requireWorkbook(ctx, user, workbookId, 'editSheets');
    },
  }).catch(refusalAbout('file'));
  return { workbookId: outcome.workbookId, revision: outcome.revision, sheets: outcome.sheets, summary: outcome.summary };
}
