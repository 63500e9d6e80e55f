import type { Config } from '../config';
import type { Db } from '../db/client';
import type { Logger } from '../logger';
import { smtpMailer } from './mailer';
import { OutboxSender } from './outbox';

/** The server process's mail sender: takes due outbox rows and sends them over SMTP until stopped. */
export function startMailOutbox(
  db: Db,
  config: Pick<Config, 'SMTP_HOST' | 'SMTP_PORT' | 'SMTP_USER' | 'SMTP_PASSWORD' | 'SMTP_SECURITY' | 'MAIL_FROM' | 'PUBLIC_URL'>,
  logger: Logger,
): { stop(): Promise<void> } {
  const mailer = smtpMailer({
    host: config.SMTP_HOST,
    port: config.SMTP_PORT,
    from: config.MAIL_FROM,
    user: config.SMTP_USER,
    password: config.SMTP_PASSWORD,
    security: config.SMTP_SECURITY,
  });
  const sender = new OutboxSender(db, mailer, logger.child({ part: 'mail-outbox' }), { messageIdDomain: new URL(config.PUBLIC_URL).hostname });
  sender.start();
  return {
    async stop() {
      await sender.stop();
      mailer.close();
    },
  };
}
