import { useState } from 'react';
import { useMessages } from '@/features/mail/api/get-messages';
import { useMessage } from '@/features/mail/api/get-message';
import { MessageText } from '@/features/mail/components/message-text';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { useDates } from '@/lib/date-format';

/** What the app has sent through the local SMTP fake (demo, development and tests). */
export default function OutboxPage() {
  const list = useMessages();
  const [selected, setSelected] = useState<number | null>(null);
  const message = useMessage(selected);
  const dates = useDates();
  return (
    <>
      <PageHeader
        title="Outbox"
        subtitle="E-mail your organisation has sent. With no SMTP_URL configured, it is kept here and goes nowhere else. One-time links (invitations, password resets) are for their addressee alone: they are withheld here and printed on the server's console."
      />
      <div className="grid gap-6 lg:grid-cols-[1fr_1.4fr]">
        <Card className="p-0">
          {list.isPending && <Loading />}
          {list.isError && <Notice tone="error">{list.error.message}</Notice>}
          {list.data?.length === 0 && <p className="p-5 text-ink-soft">No messages yet.</p>}
          <ul>
            {list.data?.map((m) => (
              <li key={m.id} className="border-b border-line last:border-0">
                <button
                  type="button"
                  onClick={() => setSelected(m.id)}
                  className={`w-full px-4 py-3 text-left ${selected === m.id ? 'bg-brand-soft' : 'hover:bg-paper'}`}
                >
                  <div className="font-medium">{m.subject}</div>
                  <div className="text-xs text-ink-soft">
                    To {m.toAddresses} · <time dateTime={m.receivedAt}>{dates.dateTime(m.receivedAt)}</time>
                  </div>
                </button>
              </li>
            ))}
          </ul>
        </Card>
        <Card>
          {selected === null && <p className="text-ink-soft">Choose a message to read it.</p>}
          {message.data && (
            <article>
              <h2 className="text-lg font-semibold">{message.data.subject}</h2>
              <p className="text-xs text-ink-soft">
                From {message.data.fromAddress} to {message.data.toAddresses}
              </p>
              <MessageText text={message.data.text} />
            </article>
          )}
        </Card>
      </div>
    </>
  );
}
