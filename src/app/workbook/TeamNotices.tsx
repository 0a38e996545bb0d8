// The lines between the toolbar and the grid that concern other people: the sheet's protection,
// inputs of mine set aside, and a stream that ended (workbook deleted, access removed, too far behind).
import { Link } from 'react-router';
import type { WorkbookModel } from '../../core/workbook/model/workbookModel.js';
import { ProtectionBanner } from '../../features/locks/ProtectionBanner.js';
import { SetAsideNotice } from '../../features/live/SetAsideNotice.js';
import type { EndReason } from '../../features/live/useLiveUpdates.js';
import type { WorkbookTeam } from '../../features/live/useWorkbookTeam.js';

const endMessages: Record<EndReason, string> = {
  deleted: 'This workbook was deleted by its owner. What you see is no longer saved anywhere.',
  access_removed: 'You no longer have access to this workbook. Changes you make here will not be saved.',
  signed_out: 'Your session has ended. Sign in again to keep working; changes you make here will not be saved.',
  too_far_behind: 'Many changes were made while this page was away. Reload to see the workbook as it is now.',
  refused: 'Live updates could not be started. Reload to try again; your own changes still save.',
};

export function TeamNotices({ team, model, activeSheetId }: { team: WorkbookTeam; model: WorkbookModel; activeSheetId: string }) {
  const ended = team.live.ended;
  return (
    <>
      {ended && (
        <div role="alert" data-grid-shield="" className="flex shrink-0 items-center gap-3 border-b border-danger-line bg-danger-soft px-3 py-1 text-caption text-ink">
          <span className="flex-1">{endMessages[ended]}</span>
          {ended === 'deleted' || ended === 'access_removed' || ended === 'signed_out' ? (
            <Link to="/" className="font-medium text-accent hover:underline">
              Back to the workbook list
            </Link>
          ) : (
            <button type="button" className="font-medium text-accent hover:underline" onClick={() => window.location.reload()}>
              Reload
            </button>
          )}
        </div>
      )}
      <div data-grid-shield="">
        <ProtectionBanner protection={team.protection} sheetId={activeSheetId} myId={team.myId} onOpen={() => team.openDialog('protect')} />
      </div>
      <SetAsideNotice inputs={team.setAside} sheetName={(id) => (model.hasSheet(id) ? model.sheet(id).name : 'deleted sheet')} onDismiss={team.dismissSetAside} />
    </>
  );
}
