import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import { logger } from '../core/logging';
import { insertMailMessage } from './store';

/**
 * The local mail fake for development and test: a real SMTP server on loopback that
 * accepts every message and stores it, so the admin outbox (and tests) can read it. Like a real
 * relay it refuses recipients in the reserved `.invalid` top-level domain (RFC 2606), which
 * gives tests and demos a way to see a message that cannot be delivered.
 */
export async function startFakeSmtp(port = 0): Promise<{ server: SMTPServer; port: number }> {
  const server = new SMTPServer({
    secure: false,
    disabledCommands: ['STARTTLS'],
    authOptional: true,
    banner: 'Ripplehall local mail fake',
    size: 5 * 1024 * 1024,
    onRcptTo(address, _session, callback) {
      if (/\.invalid$/i.test(address.address)) return callback(Object.assign(new Error('No such domain'), { responseCode: 550 }));
      callback();
    },
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => void storeMessage());
      const storeMessage = async () => {
        try {
          const raw = Buffer.concat(chunks);
          const parsed = await simpleParser(raw);
          await insertMailMessage({
            envelopeFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
            envelopeTo: session.envelope.rcptTo.map((r) => r.address).join(', '),
            subject: parsed.subject ?? null,
            textBody: parsed.text ?? null,
            htmlBody: typeof parsed.html === 'string' ? parsed.html : null,
            raw: raw.toString('utf8'),
          });
          callback();
        } catch (err) {
          logger.error({ err }, 'mail fake could not store a message');
          callback(err as Error);
        }
      };
    },
  });
  server.on('error', (err) => logger.error({ err }, 'mail fake error'));
  await new Promise<void>((resolve) => server.listen(port, '127.0.0.1', () => resolve()));
  const address = server.server.address() as AddressInfo;
  return { server, port: address.port };
}
