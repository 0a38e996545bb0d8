// The dev inbox reads messages back without mailparser: checked here against what nodemailer itself
// writes (its stream transport gives the raw RFC 5322 bytes it would send over SMTP).
import nodemailer from 'nodemailer';
import { describe, expect, it } from 'vitest';
import { decodeEncodedWords, parseMailMessage } from '../server/mail/parseMessage.js';

async function raw(mail: Parameters<ReturnType<typeof nodemailer.createTransport>['sendMail']>[0]): Promise<Buffer> {
  const transport = nodemailer.createTransport({ streamTransport: true, buffer: true, newline: 'windows' });
  const info = await transport.sendMail(mail);
  return info.message as Buffer;
}

const text = 'Dioxygen has two unpaired electrons: ³Σg⁻ ground term.\nA line long enough to be wrapped by quoted-printable soft line breaks somewhere past seventy-six characters.';

describe('reading a message back', () => {
  it('reads a plain-text message with a folded RFC 2047 subject and a quoted-printable body', async () => {
    const parsed = parseMailMessage(await raw({ from: 'Zoë <zoe@lab.test>', to: 'ann@lab.test', subject: 'Spin states of Fe²⁺ – high spin or low spin, and why the answer depends on the ligand field', text }));
    expect(parsed).toEqual({ from: 'Zoë <zoe@lab.test>', to: 'ann@lab.test', subject: 'Spin states of Fe²⁺ – high spin or low spin, and why the answer depends on the ligand field', text });
  });

  it('reads a base64 body', async () => {
    const parsed = parseMailMessage(await raw({ from: 'a@lab.test', to: 'b@lab.test', subject: 'b64', text, textEncoding: 'base64' }));
    expect(parsed.text).toBe(text);
  });

  it('takes the text part of a text-and-HTML message', async () => {
    const parsed = parseMailMessage(await raw({ from: 'a@lab.test', to: 'b@lab.test', subject: 'both', text, html: '<p>HTML version</p>' }));
    expect(parsed.text).toBe(text);
  });

  it('joins adjacent encoded words without the white space between them (RFC 2047 §6.2)', () => {
    expect(decodeEncodedWords('=?UTF-8?Q?Zo=C3=AB?= =?UTF-8?B?w4VuZ3N0csO2bQ==?=')).toBe('ZoëÅngström');
    expect(decodeEncodedWords('plain =?ISO-8859-1?Q?K=F6ln?= text')).toBe('plain Köln text');
  });
});
