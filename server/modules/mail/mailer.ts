import nodemailer, { type Transporter } from 'nodemailer';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { DataSource } from 'typeorm';
import type { AddressInfo } from 'node:net';
import { MailMessage } from '../../db/entities/mail-message.entity';

export interface OutgoingMail {
  to: string[];
  subject: string;
  text: string;
  html?: string;
}

/**
 * Sends mail through nodemailer. Without SMTP_URL, mail goes to a capture SMTP server on loopback
 * (smtp-server), which stores each message in `mail_messages` for the admin's Outbox page. With
 * SMTP_URL, mail is relayed and a copy is kept in the same table.
 */
export class Mailer {
  private transport: Transporter | null = null;
  private capture: SMTPServer | null = null;
  private mode: 'captured' | 'relayed' = 'captured';

  constructor(
    private readonly ds: DataSource,
    private readonly opts: { smtpUrl?: string; capturePort: number; from: string },
  ) {}

  async start(): Promise<void> {
    if (this.opts.smtpUrl) {
      this.mode = 'relayed';
      this.transport = nodemailer.createTransport(this.opts.smtpUrl);
      return;
    }
    const ds = this.ds;
    this.capture = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS'],
      banner: 'Placewright local mail capture',
      logger: false,
      size: 5 * 1024 * 1024,
      onData(stream, session, callback) {
        simpleParser(stream)
          .then(async (parsed) => {
            const to = (session.envelope.rcptTo ?? []).map((r) => r.address);
            await ds.getRepository(MailMessage).insert({
              from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
              to,
              subject: parsed.subject ?? '(no subject)',
              text: parsed.text ?? '',
              html: typeof parsed.html === 'string' ? parsed.html : null,
              transport: 'captured',
            });
            callback();
          })
          .catch((err: Error) => callback(err));
      },
    });
    await new Promise<void>((resolve, reject) => {
      this.capture!.once('error', reject);
      this.capture!.listen(this.opts.capturePort, '127.0.0.1', () => resolve());
    });
    const port = (this.capture.server.address() as AddressInfo).port;
    this.transport = nodemailer.createTransport({ host: '127.0.0.1', port, secure: false, ignoreTLS: true });
  }

  get capturePort(): number | null {
    return this.capture ? (this.capture.server.address() as AddressInfo).port : null;
  }

  /** Sends one message; resolves once it is stored (captured) or accepted by the relay. */
  async send(mail: OutgoingMail): Promise<void> {
    if (!this.transport) throw new Error('Mailer not started');
    const to = [...new Set(mail.to.filter(Boolean))];
    if (to.length === 0) return;
    await this.transport.sendMail({ from: this.opts.from, to, subject: mail.subject, text: mail.text, html: mail.html });
    if (this.mode === 'relayed') {
      await this.ds.getRepository(MailMessage).insert({
        from: this.opts.from, to, subject: mail.subject, text: mail.text, html: mail.html ?? null, transport: 'relayed',
      });
    }
  }

  /** Sends without failing the caller: a mail problem is logged, the user's action stands. */
  async sendQuietly(mail: OutgoingMail): Promise<void> {
    try {
      await this.send(mail);
    } catch (err) {
      console.error('[placewright] mail not sent:', (err as Error).message);
    }
  }

  async stop(): Promise<void> {
    this.transport?.close();
    if (this.capture) await new Promise<void>((r) => this.capture!.close(() => r()));
  }
}
