import type { MailMessage } from './index';

export function escapeHtml(s: string) {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

export type MailContent = {
  to: { email: string; name: string };
  subject: string;
  lines: string[];
  /** The words of the link at the end. */
  action: string;
  link: string;
  footer: string;
};

/** One e-mail to one person: a greeting, the lines, one link, and a footer, as plain text and as HTML. */
export function composeMail({ to, subject, lines, action, link, footer }: MailContent): MailMessage {
  const greeting = `Hello ${to.name},`;
  const text = [greeting, '', ...lines, '', `${action}: ${link}`, '', footer, ''].join('\n');
  const html = [
    '<!doctype html><html><body style="font-family:sans-serif;color:#111;background:#fff">',
    `<p>${escapeHtml(greeting)}</p>`,
    ...lines.map((l) => `<p>${escapeHtml(l)}</p>`),
    `<p><a href="${escapeHtml(link)}">${escapeHtml(action)}</a></p>`,
    `<p style="font-size:12px;color:#555">${escapeHtml(footer)}</p>`,
    '</body></html>',
  ].join('\n');
  return { to: to.email, subject, text, html };
}
