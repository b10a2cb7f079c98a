import { useState, type ReactNode } from 'react';
import { AlertTriangle, CheckCircle2, Clock, Paperclip } from 'lucide-react';
import type { OutboxMessage, OutboxStatus } from '@shared/schemas/users';
import { cx } from '@/components/ui/cx';
import { formatDateTime } from '@shared/datetime';
import { apiFiles } from '@shared/paths';
import { Badge, type Tone } from '@/components/ui/badge';

const STATUS: Record<OutboxStatus, { label: string; tone: Tone; icon: ReactNode }> = {
  queued: { label: 'Queued', tone: 'warn', icon: <Clock className="h-3.5 w-3.5" aria-hidden /> },
  sent: { label: 'Sent', tone: 'good', icon: <CheckCircle2 className="h-3.5 w-3.5" aria-hidden /> },
  failed: { label: 'Failed', tone: 'bad', icon: <AlertTriangle className="h-3.5 w-3.5" aria-hidden /> },
};

/** What happened to a message, in words: attempts, the last error and the next try. */
function deliveryLine(m: OutboxMessage): string {
  const tries = `${m.attempts} attempt${m.attempts === 1 ? '' : 's'}`;
  if (m.status === 'sent') return `Sent ${m.sentAt ? formatDateTime(m.sentAt) : ''} after ${tries}.`;
  if (m.status === 'failed') return `Gave up after ${tries}. Last error: ${m.lastError ?? 'unknown'}.`;
  if (m.attempts === 0) return 'Waiting to be sent.';
  return `${tries} failed (last error: ${m.lastError ?? 'unknown'}); next try ${m.nextAttemptAt ? formatDateTime(m.nextAttemptAt) : 'soon'}.`;
}

/** Renders a plain-text mail body with its links clickable. */
function MailText({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/\S+)/g);
  return (
    <pre className="whitespace-pre-wrap break-words font-sans text-sm text-ink-800">
      {parts.map((p, i) => (/^https?:\/\//.test(p) ? <a key={i} href={p} className="font-medium text-lamp-700 underline">{p}</a> : p))}
    </pre>
  );
}

export function OutboxList({ messages }: { messages: OutboxMessage[] }) {
  const [openId, setOpenId] = useState<number | null>(messages[0]?.id ?? null);
  return (
    <ul className="divide-y divide-ink-100">
      {messages.map((m) => {
        const open = openId === m.id;
        return (
          <li key={m.id}>
            <button type="button" aria-expanded={open} onClick={() => setOpenId(open ? null : m.id)} className={cx('flex w-full flex-wrap items-baseline justify-between gap-2 px-5 py-3 text-left hover:bg-ink-50', open && 'bg-ink-50')}>
              <span className="min-w-0">
                <span className="block truncate font-medium text-ink-900">{m.subject}</span>
                <span className="block truncate text-xs text-ink-500">to {m.to}</span>
              </span>
              <span className="flex items-center gap-2 text-xs text-ink-500">
                <Badge tone={STATUS[m.status].tone} icon={STATUS[m.status].icon}>{STATUS[m.status].label}{m.status !== 'sent' && m.attempts > 0 ? ` · ${m.attempts} attempt${m.attempts === 1 ? '' : 's'}` : ''}</Badge>
                {m.attachments.length + m.pendingAttachments.length > 0 && <Paperclip className="h-3.5 w-3.5" aria-label={`${m.attachments.length + m.pendingAttachments.length} attachment(s)`} />}
                <time dateTime={m.createdAt}>{formatDateTime(m.createdAt)}</time>
              </span>
            </button>
            {open && (
              <div className="px-5 pb-4">
                <p className={cx('mb-2 text-xs', m.status === 'failed' ? 'text-short-700' : 'text-ink-600')}>{deliveryLine(m)}</p>
                <MailText text={m.text} />
                {m.attachments.length + m.pendingAttachments.length > 0 && (
                  <ul className="mt-3 flex flex-wrap gap-2">
                    {m.attachments.map((a) => (
                      <li key={a.id}>
                        <a href={apiFiles.outboxAttachment(a.id)} className="inline-flex items-center gap-1 rounded-md bg-ink-100 px-2 py-1 text-xs font-medium text-ink-800 hover:bg-ink-200">
                          <Paperclip className="h-3.5 w-3.5" aria-hidden />{a.filename} <span className="text-ink-500">({Math.ceil(a.size / 1024)} KiB)</span>
                        </a>
                      </li>
                    ))}
                    {m.pendingAttachments.map((a) => (
                      <li key={`pending-${a.filename}`} className="inline-flex items-center gap-1 rounded-md border border-dashed border-ink-300 px-2 py-1 text-xs text-ink-600">
                        <Paperclip className="h-3.5 w-3.5" aria-hidden />{a.filename} <span className="text-ink-500">(built when sent)</span>
                      </li>
                    ))}
                  </ul>
                )}
              </div>
            )}
          </li>
        );
      })}
    </ul>
  );
}
