import nodemailer from 'nodemailer';

/** One message as the outbox hands it to the mail server. */
export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html: string | null;
  messageId: string;
}

export interface Mailer {
  send(message: MailMessage): Promise<void>;
  close(): void;
}

export interface SmtpSettings {
  host: string;
  port: number;
  from: string;
  /** Sign in to the mail server when given (AUTH PLAIN/LOGIN over the protected connection). */
  user?: string | undefined;
  password?: string | undefined;
  /**
   * `tls`: TLS from the first byte (port 465); `starttls`: plain, then STARTTLS, required (port 587);
   * `none`: no encryption (the local development sink only).
   */
  security?: 'tls' | 'starttls' | 'none';
}

/**
 * Mail over SMTP with nodemailer: one connection per message (no pool), so a mail server that went
 * away and came back is simply reached again. Short timeouts: a stuck server delays only this round.
 */
export function smtpMailer({ host, port, from, user, password, security = 'none' }: SmtpSettings): Mailer {
  const transport = nodemailer.createTransport({
    host,
    port,
    secure: security === 'tls',
    requireTLS: security === 'starttls',
    ignoreTLS: security === 'none',
    ...(user ? { auth: { user, pass: password ?? '' } } : {}),
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  });
  return {
    async send(message) {
      const info = await transport.sendMail({
        from,
        to: message.to,
        subject: message.subject,
        text: message.text,
        ...(message.html ? { html: message.html } : {}),
        messageId: message.messageId,
      });
      if (info.rejected.length > 0) throw new Error(`the mail server refused ${info.rejected.join(', ')}`);
    },
    close: () => transport.close(),
  };
}
