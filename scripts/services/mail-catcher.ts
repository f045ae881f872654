import { randomBytes } from 'node:crypto';
import { mkdir, rename, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { MAIL_INDEX_FILE, readMailIndex, type StoredMailEntry } from '../../server/services/mail-store';

export interface RunningMailCatcher {
  port: number;
  stop(): Promise<void>;
}

const MAX_MESSAGE_BYTES = 50 * 1024 * 1024;
const TEXT_PREVIEW_CHARS = 500;

function addressText(value: AddressObject | AddressObject[] | undefined): string {
  if (!value) return '';
  return (Array.isArray(value) ? value : [value]).map((item) => item.text).join(', ');
}

function messageFileId(now: Date): string {
  const stamp = now.toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z');
  return `${stamp}-${randomBytes(4).toString('hex')}`;
}

/** A fake SMTP server for local runs and tests: accepts every message and
 * keeps it as `<id>.eml` plus an entry in `index.json` in `storeDir`. */
export async function startMailCatcher(options: { port: number; storeDir: string; host?: string }): Promise<RunningMailCatcher> {
  await mkdir(options.storeDir, { recursive: true });
  const index: StoredMailEntry[] = await readMailIndex(options.storeDir);
  // One write at a time, so concurrent deliveries never lose an index entry.
  let indexWrites: Promise<void> = Promise.resolve();

  async function keep(raw: Buffer, envelopeFrom: string | null, envelopeTo: string[]): Promise<void> {
    const parsed = await simpleParser(raw);
    const id = messageFileId(new Date());
    const emlFile = `${id}.eml`;
    await writeFile(path.join(options.storeDir, emlFile), raw);
    const entry: StoredMailEntry = {
      id,
      emlFile,
      receivedAt: new Date().toISOString(),
      envelopeFrom,
      envelopeTo,
      from: addressText(parsed.from),
      to: addressText(parsed.to),
      subject: parsed.subject ?? '',
      messageId: parsed.messageId ?? null,
      textPreview: (parsed.text ?? '').slice(0, TEXT_PREVIEW_CHARS),
      sizeBytes: raw.length,
      attachments: parsed.attachments.map((a) => ({ filename: a.filename ?? null, contentType: a.contentType, sizeBytes: a.size })),
    };
    const write = indexWrites.then(async () => {
      index.push(entry);
      const temporary = path.join(options.storeDir, `.${MAIL_INDEX_FILE}.${id}.tmp`);
      await writeFile(temporary, `${JSON.stringify(index, null, 2)}\n`);
      await rename(temporary, path.join(options.storeDir, MAIL_INDEX_FILE));
    });
    indexWrites = write.catch(() => undefined);
    await write;
  }

  const server = new SMTPServer({
    secure: false,
    disabledCommands: ['STARTTLS'],
    authOptional: true,
    allowInsecureAuth: true,
    size: MAX_MESSAGE_BYTES,
    logger: false,
    banner: 'Paraxia local mail catcher',
    onAuth(auth, _session, callback) {
      callback(null, { user: auth.username ?? 'local' });
    },
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('error', callback);
      stream.on('end', () => {
        if ((stream as unknown as { sizeExceeded?: boolean }).sizeExceeded) {
          callback(Object.assign(new Error('Message exceeds the size limit.'), { responseCode: 552 }));
          return;
        }
        const envelopeFrom = session.envelope.mailFrom ? session.envelope.mailFrom.address : null;
        const envelopeTo = session.envelope.rcptTo.map((rcpt) => rcpt.address);
        keep(Buffer.concat(chunks), envelopeFrom, envelopeTo).then(
          () => callback(),
          (error: Error) => callback(error),
        );
      });
    },
  });

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, options.host ?? '127.0.0.1', () => {
      server.off('error', reject);
      resolve();
    });
  });
  // smtp-server logs socket errors as 'error' events; without a listener they would crash the process.
  server.on('error', () => undefined);
  const address = server.server.address();
  const port = typeof address === 'object' && address ? address.port : options.port;

  let stopped = false;
  return {
    port,
    async stop() {
      if (stopped) return;
      stopped = true;
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await indexWrites;
    },
  };
}
