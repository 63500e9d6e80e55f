import { randomUUID } from 'node:crypto';
import { chmodSync, existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';
import { sinkMessageSchema, type SinkMessage } from '@laminote/contracts';
import { decodeHeaderValue, parseMail } from './mime';

/**
 * The development and test mail server: accepts every message on loopback, keeps it (in memory, and in
 * a JSON file when given one, so a restart keeps what came in) and shows what it received over a tiny
 * HTTP API. It delivers nothing anywhere.
 *
 *   GET    /messages          newest first; ?to=<address> filters by recipient
 *   GET    /messages/:id
 *   DELETE /messages          forget everything
 *   GET    /healthz
 */
export interface SinkOptions {
  host?: string;
  smtpPort: number;
  /** 0 or absent: no HTTP API (tests that only count messages read `messages()`). */
  httpPort?: number;
  /** Keep messages in this JSON file across restarts. */
  file?: string;
  /** Oldest messages are dropped beyond this many. */
  keep?: number;
}

export interface Sink {
  smtpPort: number;
  httpPort: number | null;
  messages(): SinkMessage[];
  clear(): void;
  stop(): Promise<void>;
}

const MAX_MESSAGE_BYTES = 5 * 1024 * 1024;

function loadFile(file: string | undefined): SinkMessage[] {
  if (!file || !existsSync(file)) return [];
  try {
    const parsed = sinkMessageSchema.array().safeParse(JSON.parse(readFileSync(file, 'utf8')));
    return parsed.success ? parsed.data : [];
  } catch {
    return [];
  }
}

export async function startSink(options: SinkOptions): Promise<Sink> {
  const host = options.host ?? '127.0.0.1';
  const keep = options.keep ?? 500;
  let store: SinkMessage[] = loadFile(options.file);

  const persist = () => {
    if (!options.file) return;
    mkdirSync(path.dirname(options.file), { recursive: true, mode: 0o700 });
    const temporary = `${options.file}.${process.pid}.tmp`;
    // The copies hold people's mail: readable by this account only.
    writeFileSync(temporary, JSON.stringify(store), { mode: 0o600 });
    chmodSync(temporary, 0o600);
    renameSync(temporary, options.file);
  };

  const smtp = new SMTPServer({
    name: 'laminote-sink',
    banner: 'Laminote development mail sink: nothing is delivered',
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        if ((stream as { sizeExceeded?: boolean }).sizeExceeded) {
          callback(Object.assign(new Error('message too large'), { responseCode: 552 }));
          return;
        }
        const raw = Buffer.concat(chunks).toString('latin1');
        const mail = parseMail(raw);
        const header = (name: string) => decodeHeaderValue(mail.headers.get(name) ?? '');
        const envelopeFrom = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
        store.push({
          id: randomUUID(),
          receivedAt: new Date().toISOString(),
          envelopeFrom,
          envelopeTo: session.envelope.rcptTo.map((r) => r.address),
          from: header('from'),
          to: header('to'),
          subject: header('subject'),
          messageId: header('message-id'),
          text: mail.text,
          html: mail.html,
        });
        if (store.length > keep) store = store.slice(store.length - keep);
        persist();
        callback();
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    smtp.once('error', reject);
    smtp.listen(options.smtpPort, host, () => {
      smtp.off('error', reject);
      resolve();
    });
  });
  const smtpPort = (smtp.server.address() as AddressInfo).port;

  let web: http.Server | null = null;
  if (options.httpPort !== undefined && options.httpPort !== 0) {
    web = http.createServer((req, res) => {
      const url = new URL(req.url ?? '/', 'http://sink');
      const send = (status: number, body: unknown) => {
        res.writeHead(status, { 'content-type': 'application/json', 'cache-control': 'no-store' });
        res.end(JSON.stringify(body));
      };
      if (url.pathname === '/healthz') return send(200, { status: 'ok', messages: store.length });
      if (url.pathname === '/messages' && req.method === 'GET') {
        const to = url.searchParams.get('to')?.toLowerCase();
        const list = store.filter((m) => !to || m.envelopeTo.some((a) => a.toLowerCase() === to)).reverse();
        return send(200, list);
      }
      if (url.pathname === '/messages' && req.method === 'DELETE') {
        store = [];
        persist();
        return send(200, { cleared: true });
      }
      const one = /^\/messages\/([^/]+)$/.exec(url.pathname);
      if (one && req.method === 'GET') {
        const message = store.find((m) => m.id === one[1]);
        return message ? send(200, message) : send(404, { error: 'no such message' });
      }
      send(404, { error: 'not found' });
    });
    await new Promise<void>((resolve, reject) => {
      web!.once('error', reject);
      web!.listen(options.httpPort, host, () => resolve());
    });
  }

  return {
    smtpPort,
    httpPort: web ? (web.address() as AddressInfo).port : null,
    messages: () => [...store],
    clear: () => {
      store = [];
      persist();
    },
    async stop() {
      await new Promise<void>((resolve) => smtp.close(() => resolve()));
      if (web) {
        web.closeAllConnections();
        await new Promise<void>((resolve) => web!.close(() => resolve()));
      }
    },
  };
}
