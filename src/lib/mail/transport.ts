import nodemailer, { type Transporter } from 'nodemailer';
import { config } from '../config';

let transport: Transporter | null = null;

export function mailTransport(): Transporter {
  if (!transport) {
    const url = new URL(config().smtpUrl);
    // Fail fast so that a down server shows in /api/health and the outbox retries.
    const timeouts = 'connectionTimeout=5000&greetingTimeout=5000&socketTimeout=10000';
    url.search = url.search ? `${url.search}&${timeouts}` : `?${timeouts}`;
    transport = nodemailer.createTransport(url.toString(), { from: config().mailFrom });
  }
  return transport;
}
