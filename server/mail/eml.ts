/**
 * Reads the messages the local mail catcher stored (RFC 5322 with MIME parts), enough for
 * the development mailbox page: headers, the plain-text and the HTML part.
 */
export interface ParsedMail {
  from: string;
  to: string;
  subject: string;
  date: string;
  text: string;
  html: string | null;
}

interface Part {
  headers: Map<string, string>;
  body: string;
}

function splitPart(raw: string): Part {
  const normalised = raw.replace(/\r\n/g, '\n');
  const cut = normalised.indexOf('\n\n');
  const head = cut < 0 ? normalised : normalised.slice(0, cut);
  const body = cut < 0 ? '' : normalised.slice(cut + 2);
  const headers = new Map<string, string>();
  // Folded header lines continue with white space (RFC 5322 section 2.2.3).
  for (const line of head.replace(/\n[ \t]+/g, ' ').split('\n')) {
    const colon = line.indexOf(':');
    if (colon > 0)
      headers.set(line.slice(0, colon).trim().toLowerCase(), line.slice(colon + 1).trim());
  }
  return { headers, body };
}

function param(header: string, name: string): string | null {
  const m = new RegExp(`${name}\\s*=\\s*("([^"]*)"|[^;\\s]+)`, 'i').exec(header);
  return m ? (m[2] ?? m[1]) : null;
}

function decodeBytes(bytes: Buffer, charset: string | null): string {
  const cs = (charset ?? 'utf-8').toLowerCase();
  return cs === 'utf-8' || cs === 'utf8' || cs === 'us-ascii'
    ? bytes.toString('utf8')
    : bytes.toString('latin1');
}

/** Quoted-printable (RFC 2045 section 6.7). */
function fromQuotedPrintable(text: string): Buffer {
  const soft = text.replace(/=\n/g, '');
  const bytes: number[] = [];
  for (let i = 0; i < soft.length; i++) {
    const c = soft[i];
    if (c === '=' && /^[0-9A-Fa-f]{2}$/.test(soft.slice(i + 1, i + 3))) {
      bytes.push(parseInt(soft.slice(i + 1, i + 3), 16));
      i += 2;
    } else {
      bytes.push(...Buffer.from(c, 'utf8'));
    }
  }
  return Buffer.from(bytes);
}

function decodeBody(part: Part): string {
  const encoding = (part.headers.get('content-transfer-encoding') ?? '7bit').toLowerCase();
  const charset = param(part.headers.get('content-type') ?? '', 'charset');
  if (encoding === 'base64') return decodeBytes(Buffer.from(part.body, 'base64'), charset);
  if (encoding === 'quoted-printable') return decodeBytes(fromQuotedPrintable(part.body), charset);
  return part.body;
}

/** Encoded words in headers (RFC 2047), e.g. =?UTF-8?Q?caf=C3=A9?=. */
export function decodeHeader(value: string): string {
  return value
    .replace(/\?=\s+=\?/g, '?==?')
    .replace(/=\?([^?]+)\?([BbQq])\?([^?]*)\?=/g, (_all, charset: string, kind: string, data) =>
      kind.toUpperCase() === 'B'
        ? decodeBytes(Buffer.from(data, 'base64'), charset)
        : decodeBytes(fromQuotedPrintable(data.replace(/_/g, ' ')), charset),
    );
}

function collectLeaves(part: Part, out: Part[]): void {
  const type = part.headers.get('content-type') ?? 'text/plain';
  const boundary = /^multipart\//i.test(type) ? param(type, 'boundary') : null;
  if (!boundary) {
    out.push(part);
    return;
  }
  const pieces = part.body.split(`--${boundary}`);
  // The first piece is the preamble; the one after the closing "--boundary--" is the epilogue.
  for (const piece of pieces.slice(1)) {
    if (piece.startsWith('--')) break;
    collectLeaves(splitPart(piece.replace(/^\n/, '')), out);
  }
}

/** Parses one stored message. */
export function parseEml(raw: string): ParsedMail {
  const root = splitPart(raw);
  const leaves: Part[] = [];
  collectLeaves(root, leaves);
  const ofType = (t: string) =>
    leaves.find((p) => (p.headers.get('content-type') ?? 'text/plain').toLowerCase().startsWith(t));
  const text = ofType('text/plain');
  const html = ofType('text/html');
  const h = (name: string) => decodeHeader(root.headers.get(name) ?? '');
  return {
    from: h('from'),
    to: h('to'),
    subject: h('subject'),
    date: h('date'),
    text: text ? decodeBody(text).replace(/\n$/, '') : '',
    html: html ? decodeBody(html) : null,
  };
}
