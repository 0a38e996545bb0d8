// Reads what the fake SMTP server receives back into from / to / subject / text. mailparser is not
// installed, and the messages come from our own nodemailer calls (plain text, maybe with an HTML
// alternative), so this covers what those use: RFC 5322 headers with folding (RFC 5322 §2.2.3),
// RFC 2047 encoded words, quoted-printable and base64 bodies (RFC 2045 §6.7–6.8), UTF-8 and Latin-1
// charsets, and multipart bodies (RFC 2046 §5.1), taking the first text/plain part.

export interface ParsedMail {
  from: string;
  to: string;
  subject: string;
  text: string;
}

interface Part {
  headers: Map<string, string>;
  body: Buffer;
}

function splitPart(raw: Buffer): Part {
  const text = raw.toString('latin1'); // byte-preserving: headers are ASCII, the body is decoded later
  const match = /\r?\n\r?\n/.exec(text);
  const headerText = match ? text.slice(0, match.index) : text;
  const bodyStart = match ? match.index + match[0].length : text.length;
  const headers = new Map<string, string>();
  // Unfold: a line starting with white space continues the previous header.
  for (const line of headerText.replace(/\r?\n[ \t]+/g, ' ').split(/\r?\n/)) {
    const colon = line.indexOf(':');
    if (colon <= 0) continue;
    const name = line.slice(0, colon).trim().toLowerCase();
    if (!headers.has(name)) headers.set(name, line.slice(colon + 1).trim());
  }
  return { headers, body: Buffer.from(text.slice(bodyStart), 'latin1') };
}

function charsetDecode(bytes: Buffer, charset: string): string {
  try {
    return new TextDecoder(charset.toLowerCase() || 'utf-8').decode(bytes);
  } catch {
    return bytes.toString('utf8'); // an unknown charset label: UTF-8 is the likeliest
  }
}

function quotedPrintableBytes(text: string): Buffer {
  const unwrapped = text.replace(/=\r?\n/g, ''); // soft line breaks
  const bytes: number[] = [];
  for (let i = 0; i < unwrapped.length; i++) {
    const hex = unwrapped.slice(i + 1, i + 3);
    if (unwrapped[i] === '=' && /^[0-9A-Fa-f]{2}$/.test(hex)) {
      bytes.push(parseInt(hex, 16));
      i += 2;
    } else {
      bytes.push(unwrapped.charCodeAt(i) & 0xff);
    }
  }
  return Buffer.from(bytes);
}

/** RFC 2047: =?charset?B|Q?…?= words, with the white space between adjacent words dropped. */
export function decodeEncodedWords(value: string): string {
  return value
    .replace(/(=\?[^?]+\?[BbQq]\?[^?]*\?=)\s+(?==\?)/g, '$1')
    .replace(/=\?([^?*]+)(?:\*[^?]*)?\?([BbQq])\?([^?]*)\?=/g, (_all, charset: string, encoding: string, data: string) => {
      const bytes = encoding.toUpperCase() === 'B' ? Buffer.from(data, 'base64') : quotedPrintableBytes(data.replace(/_/g, ' '));
      return charsetDecode(bytes, charset);
    });
}

function headerParam(value: string, name: string): string | undefined {
  const m = new RegExp(`;\\s*${name}\\s*=\\s*(?:"([^"]*)"|([^;\\s]+))`, 'i').exec(value);
  return m ? (m[1] ?? m[2]) : undefined;
}

function decodeBody(part: Part): string {
  const encoding = (part.headers.get('content-transfer-encoding') ?? '7bit').toLowerCase();
  const charset = headerParam(part.headers.get('content-type') ?? '', 'charset') ?? 'utf-8';
  const raw = part.body.toString('latin1');
  const bytes = encoding === 'base64' ? Buffer.from(raw.replace(/\s+/g, ''), 'base64') : encoding === 'quoted-printable' ? quotedPrintableBytes(raw) : part.body;
  return charsetDecode(bytes, charset).replace(/\r\n/g, '\n').replace(/\n+$/, '');
}

/** The first text/plain part, depth first; undefined when the message has none. */
function findText(part: Part, depth = 0): string | undefined {
  const type = part.headers.get('content-type') ?? 'text/plain';
  const mime = type.split(';')[0].trim().toLowerCase();
  if (mime.startsWith('multipart/')) {
    const boundary = headerParam(type, 'boundary');
    if (!boundary || depth > 5) return undefined;
    const text = part.body.toString('latin1');
    const sections = text.split(new RegExp(`\\r?\\n?--${boundary.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}(?:--)?[ \\t]*\\r?\\n?`));
    // sections[0] is the preamble; the one after the closing delimiter is the epilogue.
    for (const section of sections.slice(1)) {
      if (section.trim() === '') continue;
      const found = findText(splitPart(Buffer.from(section, 'latin1')), depth + 1);
      if (found !== undefined) return found;
    }
    return undefined;
  }
  return mime === 'text/plain' ? decodeBody(part) : undefined;
}

export function parseMailMessage(raw: Buffer): ParsedMail {
  const top = splitPart(raw);
  const header = (name: string) => decodeEncodedWords(top.headers.get(name) ?? '');
  return { from: header('from'), to: header('to'), subject: header('subject'), text: findText(top) ?? '' };
}
