import { Inject, Injectable, Logger } from '@nestjs/common';
import nodemailer, { type Transporter } from 'nodemailer';
import type { Attachment } from 'nodemailer/lib/mailer';
import { APP_CONFIG, type AppConfig } from '../config/config';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html?: string;
  /** nodemailer attachments: { filename, content: Buffer, contentType }. */
  attachments?: Attachment[];
}

/** Sends mail through SMTP: maildev on loopback in development, an in-process server in tests. */
@Injectable()
export class MailService {
  private readonly logger = new Logger(MailService.name);
  private readonly transport: Transporter;

  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {
    this.transport = nodemailer.createTransport({
      host: config.mail.host,
      port: config.mail.port,
      secure: false,
      ignoreTLS: true,
    });
  }

  async send(mail: OutgoingMail): Promise<void> {
    await this.transport.sendMail({ from: this.config.mail.from, ...mail });
    this.logger.log({ to: mail.to, subject: mail.subject }, 'Mail sent');
  }
}
