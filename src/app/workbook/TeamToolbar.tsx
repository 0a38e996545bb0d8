// The team controls of an open workbook, in its title bar: whether it is live and how many are here,
// and Team, Protect, Change log and Audit (each shown only to roles that can use it; the API checks again).
import { useNavigate } from 'react-router';
import { allows } from '@shared/permissions.js';
import { Button } from '../../components/ui/Button.js';
import { AuditDialog } from '../../features/audit/AuditDialog.js';
import type { WorkbookModel } from '../../core/workbook/model/workbookModel.js';
import { HistoryDialog } from '../../features/history/HistoryDialog.js';
import { ProtectDialog } from '../../features/locks/ProtectDialog.js';
import { TeamPanel } from '../../features/sharing/TeamPanel.js';
import { LiveIndicator } from '../../features/live/LiveIndicator.js';
import type { WorkbookTeam } from '../../features/live/useWorkbookTeam.js';

export function TeamToolbar({ team, model, activeSheet, selectionRange }: { team: WorkbookTeam; model: WorkbookModel; activeSheet: { id: string; name: string }; selectionRange?: string }) {
  const navigate = useNavigate();
  const { role, actions, dialog, openDialog } = team;
  const close = () => openDialog(null);
  const isMember = role !== 'site-admin';
  return (
    // A press here must not reach the grid, which clears its selection on any press outside it:
    // Protect starts from the selected range.
    <div className="flex items-center gap-1.5" data-grid-shield="" onMouseDown={(e) => e.stopPropagation()}>
      <LiveIndicator users={team.live.presence} myId={team.myId} connection={team.live.connection} onShowTeam={isMember ? () => openDialog('team') : undefined} />
      <span aria-hidden="true" className="mx-1 h-4 w-px bg-line" />
      {isMember && (
        <Button variant={allows(actions, 'manageMembers') ? 'primary' : 'secondary'} onClick={() => openDialog('team')}>
          Team
        </Button>
      )}
      <Button variant="ghost" onClick={() => openDialog('protect')}>
        Protect
      </Button>
      {allows(actions, 'viewHistory') && (
        <Button variant="ghost" onClick={() => openDialog('history')}>
          Change log
        </Button>
      )}
      {allows(actions, 'viewAudit') && (
        <Button variant="ghost" onClick={() => openDialog('audit')}>
          Audit
        </Button>
      )}
      {isMember && (
        <TeamPanel
          open={dialog === 'team'}
          onClose={close}
          workbookId={model.id}
          title={model.title}
          role={role}
          actions={actions}
          myId={team.myId}
          sheets={model.sheets.map((s) => ({ id: s.id, name: s.name, createdBy: s.createdBy }))}
          protection={team.protection}
          presence={team.live.presence}
          onLeft={() => navigate('/', { replace: true })}
        />
      )}
      <ProtectDialog
        open={dialog === 'protect'}
        onClose={close}
        workbookId={model.id}
        sheet={{ ...activeSheet, createdBy: model.hasSheet(activeSheet.id) ? model.sheet(activeSheet.id).createdBy : null }}
        protection={team.protection}
        actions={actions}
        role={role}
        me={team.me}
        myId={team.myId}
        suggestedRange={selectionRange}
      />
      {allows(actions, 'viewHistory') && <HistoryDialog open={dialog === 'history'} onClose={close} workbookId={model.id} actions={actions} sheetName={(id) => (model.hasSheet(id) ? model.sheet(id).name : null)} />}
      {allows(actions, 'viewAudit') && <AuditDialog open={dialog === 'audit'} onClose={close} workbookId={model.id} />}
    </div>
  );
}
