import { publicUrl } from '../config';
import type { OutgoingMail } from './transport';

/** E-mail templates: each message has a plain-text part and an HTML part with the same words. */

const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/** A link into the app, built from PUBLIC_URL (or the local address) so it works from the inbox. */
export function appLink(path: string, query: Record<string, string>): string {
  const url = new URL(path, publicUrl().replace(/\/+$/, '') + '/');
  for (const [k, v] of Object.entries(query)) url.searchParams.set(k, v);
  return url.toString();
}

export interface Layout {
  heading: string;
  paragraphs: string[];
  action: { label: string; url: string };
  footnote: string;
}

export function render(layout: Layout): { text: string; html: string } {
  const text = [
    layout.heading,
    '',
    ...layout.paragraphs.flatMap((p) => [p, '']),
    `${layout.action.label}:`,
    layout.action.url,
    '',
    layout.footnote,
    '',
    '-- Ripplehall',
  ].join('\n');
  const html = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(layout.heading)}</title></head>
<body style="margin:0;padding:24px;background:#fbfaf7;font-family:'Source Sans 3',Arial,sans-serif;color:#1d2733">
<div style="max-width:520px;margin:0 auto;background:#ffffff;border:1px solid #d9d4cc;border-radius:10px;padding:24px 28px">
<p style="margin:0 0 12px;font-weight:700;color:#16324a;letter-spacing:0.02em">Ripplehall</p>
<h1 style="font-size:20px;margin:0 0 16px;color:#16324a">${escapeHtml(layout.heading)}</h1>
${layout.paragraphs.map((p) => `<p style="line-height:1.5">${escapeHtml(p)}</p>`).join('\n')}
<p style="margin:24px 0"><a href="${escapeHtml(layout.action.url)}" style="background:#16324a;color:#ffffff;padding:10px 18px;border-radius:18px;text-decoration:none;font-weight:600">${escapeHtml(layout.action.label)}</a></p>
<p style="font-size:13px;color:#5b6670;line-height:1.5">If the button does not work, copy this address into your browser:<br><span style="word-break:break-all">${escapeHtml(layout.action.url)}</span></p>
<p style="font-size:13px;color:#5b6670;line-height:1.5">${escapeHtml(layout.footnote)}</p>
</div></body></html>`;
  return { text, html };
}

export function invitationMail(to: string, invitedBy: string, link: string, hours: number): OutgoingMail {
  return {
    to,
    subject: 'You are invited to Ripplehall',
    ...render({
      heading: 'Your Ripplehall account is ready to set up',
      paragraphs: [
        `${invitedBy} has invited you to Ripplehall as a facilitator.`,
        'Ripplehall helps you decide whom to brief first when a message has to reach a whole group, and rehearse how the word will travel.',
        `Open the link below to choose your name and password. It works once and expires in ${hours} hours.`,
      ],
      action: { label: 'Set up my account', url: link },
      footnote: 'If you did not expect this invitation, you can ignore this message; nothing happens until the link is used.',
    }),
  };
}

export function resetMail(to: string, link: string, minutes: number): OutgoingMail {
  return {
    to,
    subject: 'Choose a new Ripplehall password',
    ...render({
      heading: 'Choose a new password',
      paragraphs: [
        'Someone asked to reset the password of the Ripplehall account that uses this address.',
        `Open the link below to choose a new one. It works once and expires in ${minutes} minutes. Choosing a new password signs this account out everywhere.`,
      ],
      action: { label: 'Choose a new password', url: link },
      footnote: 'If you did not ask for this, ignore this message: your password stays as it is.',
    }),
  };
}
