import { useApi } from '../api';
import { Button } from '../ui/Button';
import { EmptyState } from '../ui/EmptyState';
import { Loaded } from '../ui/Loading';
import { formatDateTime } from '../../lib/time/format';

interface Message {
  id: string;
  receivedAt: string;
  to: string[];
  subject: string;
  text: string;
}

export default function Mailbox({ locale, timeZone }: { locale: string; timeZone: string }) {
  const [mail, reload] = useApi<{ messages: Message[] }>('/api/dev/mailbox');
  return (
    <div className="space-y-4">
      <Button variant="secondary" onClick={reload}>
        Check for new mail
      </Button>
      <Loaded value={mail} reload={reload} label="the mailbox">
        {({ messages }) =>
          messages.length ? (
            <ul className="space-y-3">
              {messages.map((m) => (
                <li key={m.id} className="card">
                  <details>
                    <summary className="min-h-11 cursor-pointer">
                      <strong>{m.subject}</strong> to {m.to.join(', ')}{' '}
                      <span className="text-sm text-ink-soft">{formatDateTime(m.receivedAt, locale, timeZone)}</span>
                    </summary>
                    <pre className="mt-3 overflow-x-auto text-sm whitespace-pre-wrap">{m.text}</pre>
                  </details>
                </li>
              ))}
            </ul>
          ) : (
            <EmptyState title="No e-mail captured yet" />
          )
        }
      </Loaded>
    </div>
  );
}
