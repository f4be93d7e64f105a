import { createTransport } from 'nodemailer';
import { readMimeText } from './mime-text';

/** Messages as our own sender writes them (nodemailer), read back for the demo outbox. */
describe('reading our own messages for the demo outbox', () => {
  const compose = async (subject: string, text: string) => {
    const transport = createTransport({ streamTransport: true, buffer: true, newline: 'windows' });
    const info = await transport.sendMail({
      from: 'notices@stillwell.example',
      to: 'a@b.example',
      subject,
      text,
    });
    return (info.message as Buffer).toString('utf8');
  };

  it('decodes long quoted-printable lines, non-ASCII text and an encoded subject', async () => {
    const long = `Expected arrival at Tamsel Mouth campground (22 km downstream): ${'très '.repeat(30)}end`;
    const raw = await compose(
      'Release notice — 850 m³/s reaching Hessford',
      `First line\n\n${long}\nLast line`,
    );
    expect(raw).toMatch(/Content-Transfer-Encoding: quoted-printable/i);
    const read = readMimeText(raw);
    expect(read.subject).toBe('Release notice — 850 m³/s reaching Hessford');
    expect(read.text).toBe(`First line\n\n${long}\nLast line`);
  });

  it('takes plain ASCII as it is', async () => {
    const read = readMimeText(await compose('Plain', 'Expected release: 800 m3/s'));
    expect(read).toMatchObject({ subject: 'Plain', text: 'Expected release: 800 m3/s' });
  });
});
