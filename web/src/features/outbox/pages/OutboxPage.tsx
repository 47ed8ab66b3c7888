import { Fragment, useState } from 'react';
import { DataTable } from 'primereact/datatable';
import { Column } from 'primereact/column';
import { Tag } from 'primereact/tag';
import type { OutboxItem } from '@stavemark/shared';
import { Alert } from '@/components/Alert';
import { ErrorMessage } from '@/components/ErrorMessage';
import { ApiError } from '@/lib/api-client';
import { activeMembership, useCurrentUser } from '@/lib/auth';
import { useOutbox } from '../api/get-outbox';
import '../../classes/classes.css';

const KIND: Record<OutboxItem['kind'], string> = {
  invitation: 'Invitation',
  guardian_notice: 'Guardian notice',
  password_reset: 'Password reset',
  sitting_invitation: 'Sitting invitation',
  sitting_change: 'Sitting change',
  sitting_cancellation: 'Sitting cancelled',
};

const formatReceived = (iso: string, timeZone: string) =>
  new Intl.DateTimeFormat('en-GB', {
    timeZone,
    day: 'numeric',
    month: 'short',
    hour: '2-digit',
    minute: '2-digit',
  }).format(new Date(iso));

/** The text part with its web addresses as links, so a link in a caught invitation can be followed. */
function TextWithLinks({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/[^\s<>"]+)/g);
  return (
    <pre className="sm-mail-text">
      {parts.map((p, i) =>
        /^https?:\/\//.test(p) ? (
          <a key={i} href={p}>
            {p}
          </a>
        ) : (
          <Fragment key={i}>{p}</Fragment>
        ),
      )}
    </pre>
  );
}

/** What the local mail catcher received: development, demo and tests only. */
export function OutboxPage() {
  const me = useCurrentUser();
  const timeZone = activeMembership(me)?.timeZone ?? 'UTC';
  const outbox = useOutbox();
  const [chosen, setChosen] = useState<OutboxItem | null>(null);
  const items = outbox.data?.items ?? [];
  const shown = chosen ?? items[0] ?? null;

  const missing = outbox.error instanceof ApiError && outbox.error.status === 404;
  return (
    <section aria-labelledby="outbox-title">
      <div className="sm-page-header">
        <div>
          <h1 id="outbox-title">Outbox</h1>
          <p className="sm-page-subtitle">
            E-mails this server sent to its local mail catcher, as their recipients see them. Not
            available in production.
          </p>
        </div>
      </div>
      {missing && (
        <Alert severity="info">
          This server sends e-mail to a real mail service, so there is no Outbox to show.
        </Alert>
      )}
      {outbox.isError && !missing && <ErrorMessage error={outbox.error} what="the Outbox" />}
      {outbox.data && !outbox.data.catcher && (
        <Alert severity="info">This server has no local mail catcher folder configured.</Alert>
      )}
      <div className="sm-outbox">
        <div className="sm-table-wrap">
          <DataTable
            value={items}
            dataKey="id"
            size="small"
            aria-label="Caught e-mails"
            selectionMode="single"
            selection={shown}
            onSelectionChange={(e) => setChosen(e.value as OutboxItem)}
            paginator={items.length > 20}
            rows={20}
            emptyMessage={outbox.isPending ? 'Loading…' : 'No e-mail yet.'}
          >
            <Column
              header="Received"
              body={(m: OutboxItem) => formatReceived(m.receivedAt, timeZone)}
              style={{ width: '8rem' }}
            />
            <Column
              header="E-mail"
              body={(m: OutboxItem) => (
                <>
                  <span className="sm-outbox-subject">{m.subject}</span>
                  <small className="sm-muted">To {m.to.join(', ')}</small>
                  <span className="sm-outbox-tags">
                    <Tag value={KIND[m.kind]} severity="info" />
                    <Tag value={m.status} severity={m.status === 'sent' ? 'success' : 'warning'} />
                  </span>
                </>
              )}
            />
          </DataTable>
        </div>
        {shown && (
          <article aria-label="The chosen e-mail" className="sm-sheet">
            <h2>{shown.subject}</h2>
            <p className="sm-muted">To {shown.to.join(', ')}</p>
            <h3>Text part</h3>
            <TextWithLinks text={shown.text} />
            {shown.html && (
              <>
                <h3>HTML part</h3>
                {/* Sandboxed: no scripts, no navigation from the message itself. */}
                <iframe
                  title={`HTML part of “${shown.subject}”`}
                  className="sm-mail-html"
                  sandbox=""
                  srcDoc={shown.html}
                />
              </>
            )}
          </article>
        )}
      </div>
    </section>
  );
}
