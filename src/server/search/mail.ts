/** The saved-search e-mail: which listing fits, its figure, and a sign-in-free way to stop the e-mails. */
import { formatMoney } from '../../lib/format';
import { formatFigure, formatHeadroom } from '../../lib/search/format';
import { getConfig } from '../config';
import type { Mail } from '../email/outbox';
import type { SearchDoc } from './documents';
import type { ListingFit } from './search';

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

export interface SavedSearchMailInput {
  to: string;
  buyerName: string;
  searchName: string;
  url: string;
  doc: SearchDoc;
  fit: ListingFit | null;
  /** Earlier fits of this search that fell inside the one-e-mail-a-day limit. */
  others: SearchDoc[];
  token: string;
}

function figureLine(fit: ListingFit): string {
  const r = fit.result;
  const headroom = formatHeadroom(r);
  return `${fit.figureLabel}: ${formatFigure(r.figure, r.unit)} (worst case ${formatFigure(r.worst, r.unit)}, goal ${formatFigure(r.goal, r.unit)}${headroom ? `, headroom ${headroom}` : ''}).`;
}

export function savedSearchMail(m: SavedSearchMailInput): Mail {
  const origin = getConfig().APP_ORIGIN;
  const link = (path: string) => new URL(path, origin).toString();
  const listingUrl = link(`/listings/${m.doc.id}`);
  const unsubscribeUrl = link(`/unsubscribe?token=${encodeURIComponent(m.token)}`);
  const paragraphs = [
    `Hello ${m.buyerName},`,
    `A listing approved on Lightyard fits your saved search “${m.searchName}”: ${m.doc.title}, from ${m.doc.labName}, ${formatMoney(m.doc.priceCents, m.doc.currency)}.`,
    ...(m.fit ? [figureLine(m.fit)] : []),
    ...(m.fit?.partner ? [`Paired with ${m.fit.partner.title} (${link(`/listings/${m.fit.partner.id}`)}).`] : []),
  ];
  const others = m.others.map((d) => `- ${d.title}: ${link(`/listings/${d.id}`)}`);
  const text = [
    ...paragraphs,
    `See the listing: ${listingUrl}`,
    ...(others.length ? [`Also fitting since the last e-mail:\n${others.join('\n')}`] : []),
    `Open the search: ${link(m.url)}\nYour saved searches: ${link('/saved-searches')}`,
    `You get at most one e-mail a day for this search. To stop these e-mails (no sign-in needed): ${unsubscribeUrl}`,
  ].join('\n\n');
  const html = `<!doctype html><html><body style="font-family:sans-serif;color:#14213d;max-width:560px">
<h1 style="font-size:18px">${escapeHtml(`New fit: ${m.doc.title}`)}</h1>
${paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('')}
<p><a href="${escapeHtml(listingUrl)}">See the listing</a> · <a href="${escapeHtml(link(m.url))}">Open the search</a></p>
${m.others.length ? `<p>Also fitting since the last e-mail:</p><ul>${m.others.map((d) => `<li><a href="${escapeHtml(link(`/listings/${d.id}`))}">${escapeHtml(d.title)}</a></li>`).join('')}</ul>` : ''}
<p style="color:#5c6784;font-size:12px">At most one e-mail a day for this search. <a href="${escapeHtml(unsubscribeUrl)}">Stop these e-mails</a> (no sign-in needed).</p></body></html>`;
  return { to: m.to, subject: `New fit for “${m.searchName}”: ${m.doc.title}`, text: `${text}\n`, html };
}
