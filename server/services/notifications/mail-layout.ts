import { escapeHtml } from './escape-html';

export interface MailFact {
  label: string;
  value: string;
}

export interface MailLink {
  label: string;
  url: string;
}

export interface MailContent {
  /** The first line of the message, e.g. "Certificate C-2026-0007 has been issued". */
  heading: string;
  /** Plain sentences; never HTML. */
  paragraphs: string[];
  facts?: MailFact[];
  /** A quoted remark (a reviewer's comment), kept with its line breaks. */
  quote?: { attribution: string; text: string };
  links: MailLink[];
  /** The small print under the message. */
  footnote: string;
}

export interface RenderedMail {
  text: string;
  html: string;
}

// Paraxia's colours (tailwind.config.ts): paper, sheet, rule, ink, ink-soft, ink-faint.
const PAPER = '#F5F1E6';
const SHEET = '#FBF9F3';
const RULE = '#D8CFBA';
const INK = '#1D2229';
const INK_SOFT = '#454C57';
const INK_FAINT = '#5F6570';
const SERIF = "'Source Serif 4', Georgia, serif";
const SANS = "'IBM Plex Sans', Arial, sans-serif";
const MONO = "'IBM Plex Mono', Menlo, monospace";

function textVersion(content: MailContent): string {
  const lines: string[] = [content.heading, '='.repeat(Math.min(content.heading.length, 72)), ''];
  for (const paragraph of content.paragraphs) lines.push(paragraph, '');
  if (content.facts && content.facts.length > 0) {
    const width = Math.max(...content.facts.map((fact) => fact.label.length));
    for (const fact of content.facts) lines.push(`${`${fact.label}:`.padEnd(width + 2)}${fact.value}`);
    lines.push('');
  }
  if (content.quote) {
    lines.push(`${content.quote.attribution}:`);
    for (const line of content.quote.text.split(/\r?\n/)) lines.push(`> ${line}`);
    lines.push('');
  }
  for (const link of content.links) lines.push(`${link.label}:`, link.url, '');
  lines.push('-- ', content.footnote);
  return `${lines.join('\n')}\n`;
}

function htmlVersion(content: MailContent): string {
  const paragraph = (text: string) => `<p style="margin:0 0 14px;font-family:${SANS};font-size:15px;line-height:22px;color:${INK};">${escapeHtml(text)}</p>`;
  const facts =
    content.facts && content.facts.length > 0
      ? `<table role="presentation" cellpadding="0" cellspacing="0" style="margin:4px 0 18px;border-collapse:collapse;width:100%;">${content.facts
          .map(
            (fact) =>
              `<tr><td style="padding:6px 12px 6px 0;border-top:1px solid ${RULE};font-family:${SANS};font-size:13px;color:${INK_FAINT};white-space:nowrap;vertical-align:top;">${escapeHtml(fact.label)}</td>` +
              `<td style="padding:6px 0;border-top:1px solid ${RULE};font-family:${MONO};font-size:14px;color:${INK};">${escapeHtml(fact.value)}</td></tr>`,
          )
          .join('')}</table>`
      : '';
  const quote = content.quote
    ? `<p style="margin:0 0 6px;font-family:${SANS};font-size:13px;color:${INK_FAINT};">${escapeHtml(content.quote.attribution)}</p>` +
      `<blockquote style="margin:0 0 18px;padding:10px 14px;border-left:3px solid ${INK_SOFT};background:${PAPER};font-family:${SANS};font-size:15px;line-height:22px;color:${INK};white-space:pre-wrap;">${escapeHtml(content.quote.text)}</blockquote>`
    : '';
  const links = content.links
    .map(
      (link) =>
        `<p style="margin:0 0 10px;font-family:${SANS};font-size:15px;"><a href="${escapeHtml(link.url)}" style="color:${INK};font-weight:600;text-decoration:underline;">${escapeHtml(link.label)}</a>` +
        `<br><span style="font-family:${MONO};font-size:12px;color:${INK_FAINT};word-break:break-all;">${escapeHtml(link.url)}</span></p>`,
    )
    .join('');
  return [
    '<!doctype html>',
    `<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>${escapeHtml(content.heading)}</title></head>`,
    `<body style="margin:0;padding:24px 12px;background:${PAPER};">`,
    `<table role="presentation" cellpadding="0" cellspacing="0" align="center" style="max-width:600px;width:100%;margin:0 auto;background:${SHEET};border:1px solid ${RULE};border-radius:4px;">`,
    `<tr><td style="padding:14px 24px;border-bottom:1px solid ${RULE};font-family:${SERIF};font-size:15px;font-weight:600;letter-spacing:0.04em;color:${INK_SOFT};">Paraxia</td></tr>`,
    `<tr><td style="padding:22px 24px 8px;">`,
    `<h1 style="margin:0 0 16px;font-family:${SERIF};font-size:22px;line-height:28px;font-weight:600;color:${INK};">${escapeHtml(content.heading)}</h1>`,
    content.paragraphs.map(paragraph).join(''),
    facts,
    quote,
    links,
    `</td></tr>`,
    `<tr><td style="padding:12px 24px 16px;border-top:1px solid ${RULE};font-family:${SANS};font-size:12px;line-height:18px;color:${INK_FAINT};">${escapeHtml(content.footnote)}</td></tr>`,
    '</table></body></html>',
  ].join('\n');
}

/** One message in both forms: plain text for every reader, and simple inline-styled HTML in Paraxia's colours. */
export function renderMail(content: MailContent): RenderedMail {
  return { text: textVersion(content), html: htmlVersion(content) };
}

/** An absolute link under PUBLIC_BASE_URL. */
export function linkUnder(baseUrl: string, path: string): string {
  return `${baseUrl.replace(/\/+$/, '')}${path.startsWith('/') ? path : `/${path}`}`;
}
