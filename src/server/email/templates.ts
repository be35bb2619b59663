import type { Mail } from './outbox';

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

function layout(title: string, paragraphs: string[], action: { label: string; url: string }): string {
  const body = paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('');
  return `<!doctype html><html><body style="font-family:sans-serif;color:#14213d;max-width:560px">
<h1 style="font-size:18px">${escapeHtml(title)}</h1>${body}
<p><a href="${escapeHtml(action.url)}">${escapeHtml(action.label)}</a></p>
<p style="color:#5c6784;font-size:12px">Lightyard — surplus optics between labs.</p></body></html>`;
}

export function verificationMail(to: string, name: string, url: string): Mail {
  const lines = [
    `Hello ${name},`,
    'Confirm your e-mail address to list parts and check out on Lightyard.',
    'The link works once and expires in 48 hours.',
  ];
  return {
    to,
    subject: 'Confirm your e-mail address for Lightyard',
    text: `${lines.join('\n\n')}\n\n${url}\n`,
    html: layout('Confirm your e-mail address', lines, { label: 'Confirm e-mail address', url }),
  };
}

export function resetMail(to: string, name: string, url: string): Mail {
  const lines = [
    `Hello ${name},`,
    'Someone asked to reset the password of your Lightyard account. If it was you, choose a new password with this link.',
    'The link works once and expires in 1 hour. If you did not ask, ignore this message; your password stays as it is.',
  ];
  return {
    to,
    subject: 'Reset your Lightyard password',
    text: `${lines.join('\n\n')}\n\n${url}\n`,
    html: layout('Reset your password', lines, { label: 'Choose a new password', url }),
  };
}

export function labInviteMail(to: string, inviter: string, labName: string, url: string): Mail {
  const lines = [
    `${inviter} invites you to join ${labName} on Lightyard, to list and sell the lab's surplus parts together.`,
    'Open the link to accept. It expires in 7 days.',
  ];
  return {
    to,
    subject: `Join ${labName} on Lightyard`,
    text: `${lines.join('\n\n')}\n\n${url}\n`,
    html: layout(`Join ${labName}`, lines, { label: 'Accept the invitation', url }),
  };
}
