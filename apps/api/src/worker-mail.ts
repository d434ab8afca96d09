/** Workers send mail to SMTP_URL; without one there is nowhere to send (the fake lives in the API). */
import { config } from './config';
import { log } from './log';

export function startSmtpFakeClient(): void {
  if (!config.smtpUrl) log.warn('worker: SMTP_URL is not set; no e-mail will be sent');
}
