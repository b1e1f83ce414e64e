// Plain-text and HTML versions of Kinloop's e-mails from one description, so
// the two never say different things.

export interface EmailContent {
  greeting: string;
  paragraphs: string[];
  action?: { label: string; url: string };
  footer?: string[];
}

export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

export function renderEmail(content: EmailContent): { text: string; html: string } {
  const text = [
    content.greeting,
    '',
    ...content.paragraphs.flatMap((p) => [p, '']),
    ...(content.action ? [`${content.action.label}: ${content.action.url}`, ''] : []),
    ...(content.footer ?? []).map((f) => `-- ${f}`),
  ].join('\n');
  const html = `<!doctype html><html><body style="font-family:'IBM Plex Sans',Arial,sans-serif;color:#1d2a2f;line-height:1.5;max-width:36rem">
<p>${escapeHtml(content.greeting)}</p>
${content.paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n')}
${content.action ? `<p><a href="${escapeHtml(content.action.url)}" style="display:inline-block;background:#1e5a5f;color:#fff;padding:12px 20px;border-radius:6px;text-decoration:none">${escapeHtml(content.action.label)}</a></p><p style="font-size:13px;color:#4b5b61">Or open this link: ${escapeHtml(content.action.url)}</p>` : ''}
${(content.footer ?? []).map((f) => `<p style="font-size:13px;color:#4b5b61">${escapeHtml(f)}</p>`).join('\n')}
</body></html>`;
  return { text, html };
}
