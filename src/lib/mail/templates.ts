// The wording of the account e-mails. Plain text first; the HTML part says the same.
const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

function wrap(paragraphs: string[], link: { href: string; label: string }) {
  const html = `<div style="font-family:sans-serif;color:#1c2733;max-width:560px">${paragraphs
    .map((p) => `<p>${esc(p)}</p>`)
    .join('')}<p><a href="${esc(link.href)}" style="background:#1c2733;color:#fff;padding:8px 14px;border-radius:6px;text-decoration:none">${esc(link.label)}</a></p><p style="font-size:12px;color:#5b6670">${esc(link.href)}</p></div>`;
  return html;
}

export function invitationMail(o: { url: string; roles: string[]; invitedBy: string | null; expiresAt: Date }) {
  const lines = [
    `You have been invited to Ionotheca, your laboratory's in-house mass-spectral library${o.invitedBy ? `, by ${o.invitedBy}` : ''}.`,
    `Your role${o.roles.length > 1 ? 's' : ''}: ${o.roles.join(', ')}.`,
    `Set your password with the link below. It works once and expires on ${o.expiresAt.toISOString().replace('T', ' ').slice(0, 16)} UTC.`,
  ];
  return {
    subject: 'Your invitation to Ionotheca',
    text: `${lines.join('\n\n')}\n\n${o.url}\n`,
    html: wrap(lines, { href: o.url, label: 'Set your password' }),
  };
}

export function passwordResetMail(o: { url: string; name: string }) {
  const lines = [
    `Hello ${o.name},`,
    'someone asked to reset the password of your Ionotheca account. If that was you, choose a new password with the link below; it works once and expires in one hour.',
    'If it was not you, ignore this message: your password stays as it is.',
  ];
  return { subject: 'Reset your Ionotheca password', text: `${lines.join('\n\n')}\n\n${o.url}\n`, html: wrap(lines, { href: o.url, label: 'Choose a new password' }) };
}
