// The built-in "dev inbox": a real SMTP server (the smtp-server package) on 127.0.0.1 that accepts
// every message and stores it in mail_messages, so sharing by e-mail works on a laptop and in tests
// without a mail relay, through exactly the code path a real relay would see.
import type { AddressInfo } from 'node:net';
import { SMTPServer, type SMTPServerAddress } from 'smtp-server';
import type { Db } from '../db/index.js';
import { mailMessages } from '../db/schema.js';
import { parseMailMessage } from './parseMessage.js';

/** Invitations are a few kilobytes; anything near this is not ours. */
export const fakeSmtpMaxBytes = 1024 * 1024;

export interface FakeSmtpServer {
  host: string;
  port: number;
  close(): Promise<void>;
}

const addressList = (list: SMTPServerAddress[]) => list.map((a) => a.address).join(', ');

export async function startFakeSmtp(db: Db, onError: (err: unknown) => void): Promise<FakeSmtpServer> {
  const server = new SMTPServer({
    authOptional: true,
    // Plain SMTP on the loopback interface only: no TLS to negotiate, no accounts to check.
    disabledCommands: ['STARTTLS', 'AUTH'],
    hideSTARTTLS: true,
    disableReverseLookup: true,
    size: fakeSmtpMaxBytes,
    rejectOversized: true,
    logger: false,
    banner: 'Orbitab dev inbox',
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('error', callback);
      stream.on('end', () => {
        if (stream.sizeExceeded) return callback(Object.assign(new Error('message too large for the dev inbox'), { responseCode: 552 }));
        try {
          const mail = parseMailMessage(Buffer.concat(chunks));
          const envelope = session.envelope;
          db.insert(mailMessages)
            .values({
              // The header's From keeps the display name; the envelope's recipients are who it was delivered to (Bcc included).
              from: mail.from || (envelope.mailFrom ? envelope.mailFrom.address : ''),
              to: addressList(envelope.rcptTo) || mail.to,
              subject: mail.subject,
              text: mail.text,
            })
            .run();
          callback();
        } catch (err) {
          onError(err);
          callback(Object.assign(new Error('the dev inbox could not store the message'), { responseCode: 451 }));
        }
      });
    },
  });
  server.on('error', onError);
  await new Promise<void>((resolve, reject) => {
    server.server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      server.server.off('error', reject);
      resolve();
    });
  });
  const { address, port } = server.server.address() as AddressInfo;
  return {
    host: address,
    port,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
