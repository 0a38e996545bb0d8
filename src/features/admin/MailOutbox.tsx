// /admin/mail: every message the built-in fake SMTP server kept (GET /api/admin/mail, site admins
// only), so a site without a real mail relay can still pass an invitation link on by hand.
import { Button } from '../../components/ui/Button.js';
import { Notice } from '../../components/ui/Notice.js';
import { LoadingRows, Page } from '../../components/ui/Page.js';
import { ApiError } from '../../lib/api.js';
import { sentence } from '../../lib/fieldErrors.js';
import { timeAgo } from '../../lib/relativeTime.js';
import { useAdminMail } from './api.js';

const urlPattern = /(https?:\/\/[^\s<>"]+)/g;

/** The message text with its links clickable (only http and https; everything else stays text). */
function MessageText({ text }: { text: string }) {
  return (
    <pre className="overflow-x-auto px-3 py-2.5 font-mono text-caption whitespace-pre-wrap text-ink-2">
      {text.split(urlPattern).map((part, i) =>
        i % 2 === 1 ? (
          <a key={i} href={part} className="break-all text-accent underline">
            {part}
          </a>
        ) : (
          part
        ),
      )}
    </pre>
  );
}

export function MailOutbox() {
  const mail = useAdminMail();
  return (
    <Page
      title="Mail outbox"
      description="Messages the built-in mail server received: invitations and notices Orbitab sent. Shown to site admins only."
      actions={
        <Button busy={mail.isFetching && !mail.isPending} onClick={() => void mail.refetch()}>
          Refresh
        </Button>
      }
    >
      <title>Mail outbox · Orbitab</title>
      {mail.isPending ? (
        <LoadingRows label="Loading messages" />
      ) : mail.isError ? (
        mail.error instanceof ApiError && mail.error.status === 403 ? (
          <Notice tone="caution" title="Only site admins can read the outbox">
            {sentence(mail.error.message)}
          </Notice>
        ) : (
          <Notice tone="error" title="Could not load the outbox">
            {sentence(mail.error.message)}
          </Notice>
        )
      ) : mail.data.length === 0 ? (
        <Notice title="No messages yet">Invitations sent from a workbook’s Share dialog appear here.</Notice>
      ) : (
        <ul aria-label="Messages" className="flex flex-col gap-px overflow-hidden rounded-panel border border-line bg-line">
          {mail.data.map((m, i) => (
            <li key={m.id} className="bg-surface">
              <details open={i === 0} className="group">
                <summary className="flex cursor-default list-none items-baseline gap-3 px-3 py-2 hover:bg-raised">
                  <span className="min-w-0 flex-1 truncate font-medium text-ink">{m.subject || '(no subject)'}</span>
                  <span className="w-64 truncate text-ink-2">to {m.to}</span>
                  <span className="w-28 text-right text-caption text-ink-3 tabular-nums" title={new Date(m.receivedAt).toLocaleString()}>
                    {timeAgo(m.receivedAt)}
                  </span>
                </summary>
                <div className="border-t border-line">
                  <p className="px-3 pt-2 text-caption text-ink-3">From {m.from}</p>
                  <MessageText text={m.text} />
                </div>
              </details>
            </li>
          ))}
        </ul>
      )}
    </Page>
  );
}
