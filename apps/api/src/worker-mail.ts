/** Workers send mail to SMTP_URL; without one there is nowhere to send (the fake lives in the API). */
import { config } from './config';

export function startSmtpFakeClient(): void {
  if (!config.smtpUrl) console.warn('worker: SMTP_URL is not set; no e-mail will be sent');
}
