import type { OutgoingMail } from './outbox';

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

function page(paragraphs: string[], link: { href: string; label: string }): string {
  const body = paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n');
  return `<!doctype html><html><body style="font-family: sans-serif">\n${body}\n<p><a href="${escapeHtml(link.href)}">${escapeHtml(link.label)}</a></p>\n<p style="color:#555;font-size:smaller">Quietbridge figures are engineering estimates to be verified on hardware.</p>\n</body></html>`;
}

function mail(to: string, subject: string, paragraphs: string[], link: { href: string; label: string }, reviewId: string): OutgoingMail {
  const text = [...paragraphs, '', `${link.label}: ${link.href}`, '', 'Quietbridge figures are engineering estimates to be verified on hardware.'].join('\n');
  return { to, subject, text, html: page(paragraphs, link), reviewId };
}

export function reviewRequestedMail(input: { to: string; requester: string; designName: string; versionNumber: number; note: string; link: string; reviewId: string }): OutgoingMail {
  const paragraphs = [`${input.requester} asks you to review version ${input.versionNumber} of the design "${input.designName}".`];
  if (input.note) paragraphs.push(`Their note: ${input.note}`);
  return mail(input.to, `Review requested: ${input.designName}, version ${input.versionNumber}`, paragraphs, { href: input.link, label: 'Open the review' }, input.reviewId);
}

export function invitationMail(input: { to: string; requester: string; designName: string; versionNumber: number; note: string; link: string; expiresAt: Date; reviewId: string }): OutgoingMail {
  const paragraphs = [
    `${input.requester} asks you to review version ${input.versionNumber} of the design "${input.designName}" in Quietbridge.`,
    `Create your reviewer account with the link below. It works once and expires on ${input.expiresAt.toISOString().slice(0, 16).replace('T', ' ')} UTC.`,
  ];
  if (input.note) paragraphs.push(`Their note: ${input.note}`);
  return mail(input.to, `Invitation to review: ${input.designName}, version ${input.versionNumber}`, paragraphs, { href: input.link, label: 'Create your account and open the review' }, input.reviewId);
}

export function decisionMail(input: { to: string; reviewer: string; designName: string; versionNumber: number; decision: 'approved' | 'changes_requested'; note: string; link: string; reviewId: string }): OutgoingMail {
  const verdict = input.decision === 'approved' ? 'approved' : 'requested changes to';
  const paragraphs = [`${input.reviewer} ${verdict} version ${input.versionNumber} of "${input.designName}".`];
  if (input.note) paragraphs.push(`Their note: ${input.note}`);
  const subject = `${input.decision === 'approved' ? 'Approved' : 'Changes requested'}: ${input.designName}, version ${input.versionNumber}`;
  return mail(input.to, subject, paragraphs, { href: input.link, label: 'Open the review' }, input.reviewId);
}
