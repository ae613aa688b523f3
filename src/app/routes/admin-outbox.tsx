// Admin: every e-mail Cellwright has sent, as the local outbox stored it.
import { useState } from 'react';
import { useOutbox, useSendDigests } from '@/features/admin/api/admin';
import { Button } from '@/components/ui/button';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { formatDateTime } from '@/lib/format';

export default function AdminOutbox() {
  const outbox = useOutbox();
  const digests = useSendDigests();
  const [open, setOpen] = useState<number | null>(null);
  if (outbox.isLoading) return <Loading />;
  if (outbox.error) return <ErrorNote error={outbox.error} />;
  const messages = outbox.data!;
  const shown = messages.find((m) => m.id === open) ?? messages[0];
  return (
    <div className="max-w-6xl">
      <PageHeader
        eyebrow="Administration"
        title="Outbox"
        subtitle="Without an SMTP_URL, e-mail is kept here instead of being sent. With SMTP configured, sent messages are recorded here too. The daily digest of notices goes out every 24 h."
        actions={<Button onClick={() => digests.mutate()} disabled={digests.isPending}>{digests.data ? `${digests.data.sent} digest${digests.data.sent === 1 ? '' : 's'} sent` : 'Send the daily digest now'}</Button>}
      />
      {messages.length === 0 ? <EmptyState title="No messages yet">Invitations and review notices appear here.</EmptyState> : (
        <div className="grid gap-4 lg:grid-cols-[22rem_minmax(0,1fr)]">
          <Panel bodyClassName="p-0">
            <ul className="divide-y divide-line" aria-label="Messages">
              {messages.map((m) => (
                <li key={m.id}>
                  <button type="button" onClick={() => setOpen(m.id)} className={`w-full px-3 py-2 text-left text-sm ${shown?.id === m.id ? 'bg-copper-100/60' : 'hover:bg-paper'}`}>
                    <div className="truncate font-medium text-ink-900">{m.subject}</div>
                    <div className="flex justify-between text-xs text-ink-500"><span className="truncate">{m.to}</span><span className="num">{formatDateTime(m.createdAt)}</span></div>
                  </button>
                </li>
              ))}
            </ul>
          </Panel>
          {shown && (
            <Panel title={shown.subject}>
              <dl className="mb-3 grid grid-cols-[auto_1fr] gap-x-2 text-xs text-ink-500"><dt>To</dt><dd>{shown.to}</dd><dt>Via</dt><dd>{shown.transport} · {formatDateTime(shown.createdAt)}</dd></dl>
              <pre className="whitespace-pre-wrap font-sans text-sm text-ink-900">{shown.text}</pre>
            </Panel>
          )}
        </div>
      )}
    </div>
  );
}
