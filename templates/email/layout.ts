/** Shared frame of every e-mail: plain text first, a simple HTML twin with inline styles. */
export function escapeHtml(s: string): string {
  return s.replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!,
  )
}

export type Email = { subject: string; text: string; html: string }

export type EmailBlock =
  | { kind: 'p'; text: string }
  | { kind: 'button'; text: string; href: string }
  | { kind: 'list'; items: string[] }
  | { kind: 'small'; text: string }

export function renderEmail(opts: {
  subject: string
  studioName: string
  greeting: string
  blocks: EmailBlock[]
}): Email {
  const text = [
    opts.greeting,
    '',
    ...opts.blocks.flatMap((b) => {
      if (b.kind === 'button') return [`${b.text}: ${b.href}`, '']
      if (b.kind === 'list') return [...b.items.map((i) => `  - ${i}`), '']
      return [b.text, '']
    }),
    `— ${opts.studioName}`,
  ].join('\n')
  const body = opts.blocks
    .map((b) => {
      if (b.kind === 'p') return `<p style="margin:0 0 16px">${escapeHtml(b.text)}</p>`
      if (b.kind === 'small')
        return `<p style="margin:0 0 16px;color:#6f685f;font-size:13px">${escapeHtml(b.text)}</p>`
      if (b.kind === 'list')
        return `<ul style="margin:0 0 16px;padding-left:20px">${b.items.map((i) => `<li>${escapeHtml(i)}</li>`).join('')}</ul>`
      return `<p style="margin:0 0 20px"><a href="${escapeHtml(b.href)}" style="display:inline-block;background:#3b5b2d;color:#fff;padding:10px 18px;border-radius:6px;text-decoration:none;font-weight:500">${escapeHtml(b.text)}</a></p>`
    })
    .join('\n')
  const html = `<!doctype html><html><body style="margin:0;background:#faf7f1;font-family:Roboto,Arial,sans-serif;color:#2d2a26">
<div style="max-width:560px;margin:0 auto;padding:24px">
<div style="font-size:18px;font-weight:700;color:#3b5b2d;margin-bottom:16px">${escapeHtml(opts.studioName)}</div>
<div style="background:#fff;border-radius:10px;padding:24px;box-shadow:0 1px 3px rgba(0,0,0,.06)">
<p style="margin:0 0 16px">${escapeHtml(opts.greeting)}</p>
${body}
</div>
<p style="font-size:12px;color:#8f887e;margin-top:16px">Sent by Lathercase for ${escapeHtml(opts.studioName)}.</p>
</div></body></html>`
  return { subject: opts.subject, text, html }
}
