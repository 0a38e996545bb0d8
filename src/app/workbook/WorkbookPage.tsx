// The workbook screen (/workbooks/:id): loads the workbook, then hands it to the workspace.
import { useEffect, useLayoutEffect } from 'react';
import { Link, useParams } from 'react-router';
import { Notice } from '../../components/ui/Notice.js';
import { ApiError } from '../../lib/api.js';
import { useWorkbookSession } from '../../core/workbook/session/useWorkbookSession.js';
import { Workspace } from './Workspace.js';
import { PreviewGrid } from '../../features/grid/components/PreviewGrid.js';
import { endEarlyGlance } from '../earlyGlance.js';

export function WorkbookPage() {
  const { id = '' } = useParams();
  const { session, preview, previewFrame, error } = useWorkbookSession(id);

  // The first rows the page's first script drew stay until this screen draws something of its own
  // (taken away before that frame is painted, so the two never show at once and nothing flickers).
  const drawn = Boolean(error || session || (preview && previewFrame));
  useLayoutEffect(() => {
    if (drawn) endEarlyGlance();
  }, [drawn]);

  useEffect(() => {
    if (session) document.title = `${session.model.title} · Orbitab`;
    return () => {
      document.title = 'Orbitab';
    };
  }, [session]);

  if (error) {
    const missing = error instanceof ApiError && (error.status === 404 || error.status === 403);
    return (
      <div className="mx-auto max-w-xl p-6">
        <Notice tone="error" title={missing ? 'This workbook is not available' : 'The workbook could not be opened'}>
          {missing ? 'It does not exist, or it has not been shared with you.' : error.message}{' '}
          <Link to="/" className="text-accent underline">
            Back to the workbook list
          </Link>
        </Notice>
      </div>
    );
  }
  if (!session && preview && previewFrame) return <PreviewGrid title={previewFrame.title} preview={preview} settings={previewFrame.settings} />;
  if (!session) {
    return (
      <div className="p-4 text-ui text-ink-2" aria-busy="true">
        Opening workbook…
      </div>
    );
  }
  return <Workspace key={session.model.id} session={session} />;
}
