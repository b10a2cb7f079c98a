import { useState } from 'react';
import { Paperclip } from 'lucide-react';
import type { OutboxMessage } from '@shared/schemas/users';
import { cx } from '@/components/ui/cx';
import { formatDateTime } from '@shared/datetime';

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
                <span className="block text-xs text-ink-500">to {m.to}</span>
              </span>
              <span className="flex items-center gap-2 text-xs text-ink-500">
                {m.attachments.length > 0 && <Paperclip className="h-3.5 w-3.5" aria-label={`${m.attachments.length} attachment(s)`} />}
                <time dateTime={m.createdAt}>{formatDateTime(m.createdAt)}</time>
              </span>
            </button>
            {open && (
              <div className="px-5 pb-4">
                <MailText text={m.text} />
                {m.attachments.length > 0 && (
                  <ul className="mt-3 flex flex-wrap gap-2">
                    {m.attachments.map((a) => (
                      <li key={a.id}>
                        <a href={`/api/outbox/attachments/${a.id}`} className="inline-flex items-center gap-1 rounded-md bg-ink-100 px-2 py-1 text-xs font-medium text-ink-800 hover:bg-ink-200">
                          <Paperclip className="h-3.5 w-3.5" aria-hidden />{a.filename} <span className="text-ink-500">({Math.ceil(a.size / 1024)} KiB)</span>
                        </a>
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
