import { useRef, useState, type FormEvent } from 'react';
import { api, ApiError, useApi } from '../api';
import { formatDateTime } from '../../lib/time/format';
import { Button } from '../ui/Button';
import { TextAreaField } from '../ui/Field';
import { Loaded } from '../ui/Loading';

interface Message {
  id: string;
  body: string;
  sentAt: string;
  author: { name: string; role: 'staff' | 'client' | 'carer'; you: boolean };
  flagQuote: string | null;
  unread: boolean;
  readBy: string[];
}
interface Thread {
  clientId: string;
  clientName: string;
  staff: boolean;
  messages: Message[];
}

const ROLE: Record<Message['author']['role'], string> = { staff: 'clinic', client: 'rider', carer: 'carer' };

/**
 * The thread between the clinic, the rider and their carers, newest first.
 * `flag` (from triage's "Contact …" on a flag) quotes that flag in the message.
 */
export default function MessageThread({ clientId, locale, timeZone, flagId, flagQuote }: { clientId: string; locale: string; timeZone: string; flagId?: string | null; flagQuote?: string | null }) {
  const [thread, reload] = useApi<Thread>(`/api/clients/${clientId}/messages`);
  const [body, setBody] = useState('');
  const [quoting, setQuoting] = useState(Boolean(flagId && flagQuote));
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const [sent, setSent] = useState(false);
  const status = useRef<HTMLParagraphElement>(null);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    setSent(false);
    try {
      await api('POST', `/api/clients/${clientId}/messages`, { body, ...(quoting && flagId ? { flagId } : {}) });
      setBody('');
      setQuoting(false);
      setSent(true);
      reload();
      setTimeout(() => status.current?.focus(), 0);
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="space-y-4">
      <form method="post" onSubmit={submit} noValidate className="card space-y-3" aria-label="New message">
        <div role="status" aria-live="polite">
          {sent && (
            <p ref={status} tabIndex={-1} className="rounded-lg border-l-4 border-moss bg-moss-tint px-4 py-3">
              Message sent. The others on this thread get an e-mail saying a message is waiting, without its text.
            </p>
          )}
        </div>
        {quoting && flagQuote && (
          <div className="space-y-2 rounded-lg border-l-4 border-slate bg-slate-tint px-4 py-3" data-testid="flag-quote">
            <p className="font-semibold">About this flag:</p>
            <blockquote className="italic">{flagQuote}</blockquote>
            <Button variant="quiet" onClick={() => setQuoting(false)}>
              Send without the flag
            </Button>
          </div>
        )}
        <TextAreaField label="Message" rows={4} value={body} onChange={(e) => setBody(e.target.value)} error={error ? (error.field('body') ?? error.message) : undefined} help="Kinloop is not for emergencies: if symptoms appear, follow the rider’s plan and call emergency services when they do not settle." />
        <Button type="submit" busy={busy}>
          Send message
        </Button>
      </form>
      <Loaded value={thread} reload={reload} label="the messages">
        {({ messages }) =>
          messages.length ? (
            <ol className="space-y-3" aria-label="Messages, newest first" data-testid="messages">
              {messages.map((m) => (
                <li key={m.id} className={`card space-y-1 ${m.author.you ? 'border-l-4 border-l-lagoon' : ''}`}>
                  <p className="text-sm text-ink-soft">
                    {m.author.you ? 'You' : `${m.author.name} (${ROLE[m.author.role]})`} · <time dateTime={m.sentAt}>{formatDateTime(m.sentAt, locale, timeZone, 'dateShort')}</time>
                    {m.unread && <span className="ml-2 rounded-full border border-lagoon px-2 font-semibold text-lagoon-dark">New</span>}
                  </p>
                  {m.flagQuote && <blockquote className="border-l-4 border-slate pl-3 text-sm italic">About: {m.flagQuote}</blockquote>}
                  <p className="whitespace-pre-line">{m.body}</p>
                  {m.author.you && <p className="text-sm text-ink-soft">{m.readBy.length ? `Read by ${m.readBy.join(', ')}` : 'Not read yet'}</p>}
                </li>
              ))}
            </ol>
          ) : (
            <p className="text-ink-soft">No messages yet.</p>
          )
        }
      </Loaded>
    </div>
  );
}
