import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import nodemailer from 'nodemailer';
import { afterEach, describe, expect, it } from 'vitest';
import { readMailIndex } from '../../server/services/mail-store';
import { startMailCatcher, type RunningMailCatcher } from './mail-catcher';

let folder: string | undefined;
let catcher: RunningMailCatcher | undefined;

afterEach(async () => {
  await catcher?.stop();
  if (folder) await rm(folder, { recursive: true, force: true });
  catcher = undefined;
  folder = undefined;
});

function transportTo(port: number) {
  return nodemailer.createTransport({ host: '127.0.0.1', port, secure: false, ignoreTLS: true });
}

describe('startMailCatcher', () => {
  it('keeps each message as .eml and indexes sender, recipients, subject and attachments', async () => {
    folder = await mkdtemp(path.join(tmpdir(), 'paraxia-mail-'));
    catcher = await startMailCatcher({ port: 0, storeDir: folder });
    const transport = transportTo(catcher.port);
    await transport.sendMail({
      from: 'Larkspur Lab <certificates@larkspur-lab.example>',
      to: 'buyer@quillmere.example, optics@tovel-marine.example',
      subject: 'Certificate PX-0042 revision 1',
      text: 'Focal length 99.93 mm ± 0.12 mm (k = 2).',
      attachments: [{ filename: 'PX-0042.pdf', content: Buffer.from('%PDF-1.7 fake'), contentType: 'application/pdf' }],
    });
    transport.close();

    const index = await readMailIndex(folder);
    expect(index).toHaveLength(1);
    expect(index[0]).toMatchObject({
      envelopeFrom: 'certificates@larkspur-lab.example',
      envelopeTo: ['buyer@quillmere.example', 'optics@tovel-marine.example'],
      subject: 'Certificate PX-0042 revision 1',
      attachments: [{ filename: 'PX-0042.pdf', contentType: 'application/pdf', sizeBytes: 13 }],
    });
    expect(index[0].textPreview).toContain('99.93 mm ± 0.12 mm');
    const files = await readdir(folder);
    expect(files.sort()).toEqual([index[0].emlFile, 'index.json'].sort());
  });

  it('loses no index entry when several messages arrive at once, and keeps them across restarts', async () => {
    folder = await mkdtemp(path.join(tmpdir(), 'paraxia-mail-'));
    catcher = await startMailCatcher({ port: 0, storeDir: folder });
    const transport = transportTo(catcher.port);
    await Promise.all(
      Array.from({ length: 8 }, (_, i) => transport.sendMail({ from: 'a@lab.example', to: 'b@client.example', subject: `m${i}`, text: 'x' })),
    );
    transport.close();
    await catcher.stop();

    catcher = await startMailCatcher({ port: 0, storeDir: folder });
    const again = transportTo(catcher.port);
    await again.sendMail({ from: 'a@lab.example', to: 'b@client.example', subject: 'after restart', text: 'x' });
    again.close();

    const subjects = (await readMailIndex(folder)).map((entry) => entry.subject);
    expect(subjects.slice(0, 8).sort()).toEqual(['m0', 'm1', 'm2', 'm3', 'm4', 'm5', 'm6', 'm7']);
    expect(subjects[8]).toBe('after restart');
  });
});
