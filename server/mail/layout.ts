/** Escapes text for HTML element content and attribute values. */
export function escapeHtml(value: string): string {
  return value
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

/** What a message says, before it is laid out as plain text and as HTML. */
export interface MailContent {
  subject: string;
  /** Paragraphs of plain text (escaped for the HTML form). */
  paragraphs: string[];
  /** The one thing to do, as a button in HTML and a bare link in text. */
  action?: { label: string; url: string };
  /** Quoted words of a person (a note with a link, a comment). */
  quote?: string;
  /** A small closing line, e.g. when the link stops working. */
  footnote?: string;
}

/** A message ready for the transport. */
export interface Mail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

/** Lays out one message in both forms, plain text first (clients that show text read it). */
export function layoutMail(to: string, content: MailContent): Mail {
  const text = [
    ...content.paragraphs,
    ...(content.quote ? [content.quote.replace(/^/gm, '> ')] : []),
    ...(content.action ? [`${content.action.label}:\n${content.action.url}`] : []),
    ...(content.footnote ? [content.footnote] : []),
    '-- \nChainwright, receiver front-end design',
  ].join('\n\n');
  const para = (t: string) =>
    `<p style="margin:0 0 14px;line-height:1.5">${escapeHtml(t).replace(/\n/g, '<br>')}</p>`;
  const html = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(content.subject)}</title></head>
<body style="margin:0;padding:24px;background:#f3f1ea;font-family:'Atkinson Hyperlegible',Verdana,sans-serif;color:#1d2a2e">
<div style="max-width:560px;margin:0 auto;background:#fffdf7;border-top:6px solid #2f6f5e;padding:24px 28px">
<div style="font-weight:bold;letter-spacing:.04em;color:#2f6f5e;margin-bottom:18px">CHAINWRIGHT</div>
${content.paragraphs.map(para).join('\n')}
${content.quote ? `<blockquote style="margin:0 0 14px;padding:8px 12px;border-left:3px solid #c9a34a;background:#f7f1e1">${escapeHtml(content.quote).replace(/\n/g, '<br>')}</blockquote>` : ''}
${content.action ? `<p style="margin:20px 0"><a href="${escapeHtml(content.action.url)}" style="display:inline-block;background:#2f6f5e;color:#fff;padding:10px 18px;text-decoration:none;border-radius:4px">${escapeHtml(content.action.label)}</a></p><p style="font-size:13px;color:#55646a;word-break:break-all">${escapeHtml(content.action.url)}</p>` : ''}
${content.footnote ? `<p style="font-size:13px;color:#55646a">${escapeHtml(content.footnote)}</p>` : ''}
</div></body></html>`;
  return { to, subject: content.subject, text, html };
}
