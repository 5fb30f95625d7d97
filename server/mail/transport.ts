import nodemailer, { type Transporter } from 'nodemailer';
import type { SMTPServer } from 'smtp-server';
import { config } from '../config';
import { startFakeSmtp } from './fake-smtp';

let transporter: Transporter | undefined;
let fake: SMTPServer | undefined;

/** True while the local fake catches mail (the admin outbox is shown only then). */
export const mailFakeOn = () => fake !== undefined;

export async function startMail(): Promise<void> {
  if (transporter) return;
  if (config.MAIL_MODE === 'fake') {
    const started = await startFakeSmtp(config.SMTP_PORT);
    fake = started.server;
    transporter = nodemailer.createTransport({ host: '127.0.0.1', port: started.port, secure: false, ignoreTLS: true });
  } else {
    transporter = nodemailer.createTransport({
      host: config.SMTP_HOST,
      port: config.SMTP_PORT || 587,
      secure: config.SMTP_SECURE,
      auth: config.SMTP_USER ? { user: config.SMTP_USER, pass: config.SMTP_PASSWORD } : undefined,
    });
  }
}

export async function stopMail(): Promise<void> {
  transporter?.close();
  transporter = undefined;
  if (fake) await new Promise<void>((resolve) => fake!.close(() => resolve()));
  fake = undefined;
}

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

export async function sendMail(mail: OutgoingMail): Promise<void> {
  if (!transporter) await startMail();
  await transporter!.sendMail({ from: config.MAIL_FROM, ...mail });
}
