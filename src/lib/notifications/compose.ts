// Kinloop's notification e-mails, plain text and HTML from one description.
// Each says why it came and carries an unsubscribe link that works without
// signing in. No clinical detail goes beyond what the recipient may see.
import { SHORT_CAUTION } from '../checks/safety-text';
import { config } from '../config';
import { renderEmail, type EmailContent } from '../mail/render';
import type { EmailMessage } from '../mail/outbox';
import { TOPIC_WORDS, type Topic } from './preferences';

export interface Recipient {
  userId: string;
  email: string;
  name: string;
  unsubscribeToken: string;
}


export function notificationEmail(
  to: Recipient,
  topic: Topic,
  p: { kind: string; subject: string; paragraphs: string[]; action?: EmailContent['action']; dedupeKey: string; caution?: boolean },
): EmailMessage {
  const unsubscribe = `${config().publicUrl}/unsubscribe/${to.unsubscribeToken}?topic=${topic}`;
  const body = renderEmail({
    greeting: `Hello ${to.name},`,
    paragraphs: p.paragraphs,
    action: p.action,
    footer: [
      ...(p.caution ? SHORT_CAUTION : []),
      `You get this e-mail because ${TOPIC_WORDS[topic]} are on for your Kinloop account. Stop them: ${unsubscribe} — or choose which e-mails you get: ${config().publicUrl}/settings/notifications`,
    ],
  });
  return { kind: p.kind, to: to.email, userId: to.userId, subject: p.subject, ...body, headers: { 'List-Unsubscribe': `<${unsubscribe}>` }, dedupeKey: p.dedupeKey };
}
