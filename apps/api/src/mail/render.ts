// Renders an e-mail from the message catalogue into a plain-text and an HTML part.
import { currencyExponent, toMajorString } from '@emberline/domain';
import en, { type MailMessages, type TemplateMessages } from './messages/en';
import de from './messages/de';

/** What each template needs; links must be absolute http(s) URLs. */
export interface MailTemplateData {
  'verify-email': { name: string; link: string };
  'reset-password': { name: string; link: string; minutes: number };
  invitation: { inviterName: string; organisationName: string; role: string; link: string; days: number };
  'account-locked': { name: string; minutes: number; resetLink: string };
  'password-changed': { name: string };
  /** To network admins: an application waits in the review queue. */
  'application-submitted': { organisationName: string; link: string };
  'application-approved': { name: string; organisationName: string; link: string };
  'application-changes-requested': { name: string; organisationName: string; message: string; link: string };
  'application-rejected': { name: string; organisationName: string; message: string };
  'organisation-suspended': { name: string; organisationName: string; reason: string; link: string };
  'organisation-reinstated': { name: string; organisationName: string; link: string };
  /** `expiresOn` is a date, YYYY-MM-DD. */
  'insurance-expiring': { name: string; organisationName: string; expiresOn: string; link: string };
  /** To network admins: a partner was suspended by the system (e.g. its insurance expired). */
  'partner-suspended': { organisationName: string; reason: string; link: string };
  /** To an owner who asked to hear when someone covers a place: stored, and how long. */
  'coverage-alert-confirmed': { serviceName: string; days: number };
  /** To that owner: a partner now works there; the link opens the Directory's search. */
  'coverage-alert-match': { serviceName: string; organisationName: string; link: string };
  /** To the owner: the payment is authorised and the booking waits for the partner. */
  'booking-requested': { name: string; reference: string; serviceName: string; partnerName: string; start: MailWhen; amount: MailMoney; link: string };
  /** To the owner: the partner confirmed (sent with the calendar invitation). */
  'booking-confirmed': { name: string; reference: string; serviceName: string; partnerName: string; start: MailWhen; place: string; link: string };
  /** To the owner, a day before the start. */
  'booking-reminder': { name: string; reference: string; serviceName: string; partnerName: string; start: MailWhen; place: string; link: string };
  'booking-rescheduled': { name: string; reference: string; serviceName: string; partnerName: string; start: MailWhen; previousStart: MailWhen; link: string };
  /** To the owner who cancelled: what the policy charged and what was released. */
  'booking-cancelled': { name: string; reference: string; serviceName: string; start: MailWhen; fee: MailMoney; refund: MailMoney; link: string };
  /** To the owner: the partner declined or cancelled; the hold is released. */
  'booking-declined': { name: string; reference: string; serviceName: string; partnerName: string; start: MailWhen; reason: string; amount: MailMoney; link: string };
  /** To the owner: nobody confirmed before the start; the hold is released. */
  'booking-expired': { name: string; reference: string; serviceName: string; partnerName: string; start: MailWhen; amount: MailMoney; link: string };
  /** To the owner: the job is done and its payment taken; the receipt. */
  'booking-completed': { name: string; reference: string; serviceName: string; partnerName: string; start: MailWhen; completedAt: MailWhen; amount: MailMoney; link: string };
  /** To the partner admins and the assigned technician. */
  'partner-booking-new': { name: string; reference: string; serviceName: string; start: MailWhen; customerName: string; place: string; link: string };
  'partner-booking-cancelled': { name: string; reference: string; serviceName: string; start: MailWhen; customerName: string; fee: MailMoney; link: string };
  'partner-booking-rescheduled': { name: string; reference: string; serviceName: string; start: MailWhen; previousStart: MailWhen; customerName: string; link: string };
}
export type MailTemplate = keyof MailTemplateData;

/** An amount in minor units; written in the mail language with the currency (e.g. "€265.00", "265,00 €"). */
export interface MailMoney {
  minor: number;
  currency: string;
}
/** An instant written as local time in the zone the job happens in, with the zone's abbreviation. */
export interface MailWhen {
  at: string;
  timeZone: string;
}

export const MAIL_LOCALES = ['en', 'de'] as const;
export type MailLocale = (typeof MAIL_LOCALES)[number];

export interface RenderedMail {
  subject: string;
  text: string;
  html: string;
}

const catalogues: Record<MailLocale, MailMessages> = { en, de };

/** The field whose URL the call-to-action button opens; templates without one have no button. */
export const ACTION_LINK: { readonly [T in MailTemplate]: (keyof MailTemplateData[T] & string) | null } = {
  'verify-email': 'link',
  'reset-password': 'link',
  invitation: 'link',
  'account-locked': 'resetLink',
  'password-changed': null,
  'application-submitted': 'link',
  'application-approved': 'link',
  'application-changes-requested': 'link',
  'application-rejected': null,
  'organisation-suspended': 'link',
  'organisation-reinstated': 'link',
  'insurance-expiring': 'link',
  'partner-suspended': 'link',
  'coverage-alert-confirmed': null,
  'coverage-alert-match': 'link',
  'booking-requested': 'link',
  'booking-confirmed': 'link',
  'booking-reminder': 'link',
  'booking-rescheduled': 'link',
  'booking-cancelled': 'link',
  'booking-declined': 'link',
  'booking-expired': 'link',
  'booking-completed': 'link',
  'partner-booking-new': 'link',
  'partner-booking-cancelled': 'link',
  'partner-booking-rescheduled': 'link',
};
export const MAIL_TEMPLATES = Object.keys(ACTION_LINK) as MailTemplate[];

const LINK_FIELDS = new Set(['link', 'resetLink']);
/** Durations are numbers in the data and read as "30 minutes" / "30 Minuten" in the text. */
const DURATION_UNITS: Record<string, 'minute' | 'day'> = { minutes: 'minute', days: 'day' };
/** Calendar dates are YYYY-MM-DD in the data and read as "1 March 2027" / "1. März 2027". */
const DATE_FIELDS = new Set(['expiresOn']);
/** Money ({ minor, currency }) and instants ({ at, timeZone }) in the data, written with Intl in the mail language. */
const MONEY_FIELDS = new Set(['amount', 'fee', 'refund']);
const WHEN_FIELDS = new Set(['start', 'previousStart', 'completedAt']);

const isMoney = (v: unknown): v is MailMoney => typeof v === 'object' && v !== null && Number.isInteger((v as MailMoney).minor) && typeof (v as MailMoney).currency === 'string';
const isWhen = (v: unknown): v is MailWhen => typeof v === 'object' && v !== null && typeof (v as MailWhen).at === 'string' && typeof (v as MailWhen).timeZone === 'string';

function formatMoney(locale: MailLocale, m: MailMoney): string {
  const digits = currencyExponent(m.currency);
  const format = new Intl.NumberFormat(locale, { style: 'currency', currency: m.currency, minimumFractionDigits: digits, maximumFractionDigits: digits });
  return format.format(toMajorString(m.minor, m.currency) as Intl.StringNumericLiteral);
}

function formatWhen(locale: MailLocale, w: MailWhen): string {
  return new Intl.DateTimeFormat(locale, { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric', hour: '2-digit', minute: '2-digit', hourCycle: 'h23', timeZoneName: 'short', timeZone: w.timeZone }).format(new Date(w.at));
}

const colour = { text: '#1e293b', muted: '#64748b', secondary: '#334155', ember: '#c2410c', page: '#f8fafc', line: '#e2e8f0', white: '#ffffff' };
// the same stack as the apps' theme, so the mail reads like the product
const fontStack = "'Lato', system-ui, -apple-system, 'Segoe UI', 'Helvetica Neue', Arial, sans-serif";

export class MailRenderError extends Error {
  override name = 'MailRenderError';
}

/** The catalogue locale for a requested one: "de-AT" reads German, anything unknown English. */
export function resolveMailLocale(locale: string): MailLocale {
  const primary = locale.toLowerCase().split(/[-_]/)[0];
  return (MAIL_LOCALES as readonly string[]).includes(primary ?? '') ? (primary as MailLocale) : 'en';
}

export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** Only absolute http(s) URLs may become links; anything else (javascript:, data:, relative) is a bug upstream. */
function safeLink(field: string, value: unknown): string {
  let url: URL;
  try {
    url = new URL(String(value));
  } catch {
    throw new MailRenderError(`Mail field "${field}" must be an absolute http(s) URL`);
  }
  if (url.protocol !== 'http:' && url.protocol !== 'https:') {
    throw new MailRenderError(`Mail field "${field}" must be an http(s) URL, not ${url.protocol}`);
  }
  return url.href;
}

function formatValues(locale: MailLocale, messages: MailMessages, data: Record<string, unknown>): Record<string, string> {
  const values: Record<string, string> = {};
  for (const [key, value] of Object.entries(data)) {
    const unit = DURATION_UNITS[key];
    if (LINK_FIELDS.has(key)) values[key] = safeLink(key, value);
    else if (unit && typeof value === 'number') {
      values[key] = new Intl.NumberFormat(locale, { style: 'unit', unit, unitDisplay: 'long' }).format(value);
    } else if (key === 'role' && typeof value === 'string') values[key] = messages.roles[value] ?? value;
    else if (DATE_FIELDS.has(key) && typeof value === 'string' && /^\d{4}-\d{2}-\d{2}$/.test(value)) {
      values[key] = new Intl.DateTimeFormat(locale, { dateStyle: 'long', timeZone: 'UTC' }).format(new Date(`${value}T00:00:00Z`));
    }
    else if (MONEY_FIELDS.has(key) && isMoney(value)) values[key] = formatMoney(locale, value);
    else if (WHEN_FIELDS.has(key) && isWhen(value)) values[key] = formatWhen(locale, value);
    else values[key] = String(value);
  }
  return values;
}

/** Fills `{name}` placeholders; `escape` applies to our words and the values alike. */
function interpolate(message: string, values: Record<string, string>, escape: (s: string) => string): string {
  return message
    .split(/(\{\w+\})/)
    .map((part, i) => {
      if (i % 2 === 0) return escape(part);
      const key = part.slice(1, -1);
      const value = values[key];
      // a missing value would silently send "{name}" to a customer
      if (value === undefined) throw new MailRenderError(`Mail placeholder {${key}} has no value`);
      return escape(value);
    })
    .join('');
}

const plain = (s: string) => s;

function renderText(t: TemplateMessages, c: MailMessages['common'], values: Record<string, string>, link: string | null): string {
  const fill = (m: string) => interpolate(m, values, plain);
  const blocks = [fill(t.greeting), ...t.paragraphs.map(fill)];
  if (link && t.action) blocks.push(`${fill(t.action)}:\n${link}`);
  blocks.push(...(t.afterAction ?? []).map(fill));
  blocks.push(`${c.signOff}\n${c.signature}`);
  // "-- " is the conventional signature separator mail clients recognise
  blocks.push(`-- \n${c.footer}`);
  return blocks.join('\n\n') + '\n';
}

function renderHtml(locale: MailLocale, subject: string, t: TemplateMessages, c: MailMessages['common'], values: Record<string, string>, link: string | null): string {
  const fill = (m: string) => interpolate(m, values, escapeHtml);
  const font = `font-family:${fontStack};`;
  const p = (html: string, style = '') => `<p style="margin:0 0 16px;${style}">${html}</p>`;
  const parts: string[] = [
    `<p style="margin:0 0 24px;font-size:14px;font-weight:700;letter-spacing:0.04em;color:${colour.ember};">${escapeHtml(c.signature)}</p>`,
    `<h1 style="margin:0 0 16px;font-size:22px;line-height:1.3;font-weight:700;color:${colour.text};">${fill(t.heading)}</h1>`,
    p(fill(t.greeting)),
    ...t.paragraphs.map((m) => p(fill(m))),
  ];
  if (link && t.action) {
    const href = escapeHtml(link);
    parts.push(
      `<table role="presentation" cellpadding="0" cellspacing="0" border="0" style="margin:8px 0 24px;"><tr>` +
        `<td style="border-radius:6px;background-color:${colour.ember};">` +
        `<a href="${href}" style="display:inline-block;padding:12px 24px;${font}font-size:16px;font-weight:700;line-height:1.2;color:${colour.white};text-decoration:none;border-radius:6px;">${fill(t.action)}</a>` +
        `</td></tr></table>`,
      p(`${escapeHtml(c.linkHint)}<br><a href="${href}" style="color:${colour.ember};text-decoration:underline;word-break:break-all;">${href}</a>`, `font-size:14px;color:${colour.secondary};`),
    );
  }
  parts.push(...(t.afterAction ?? []).map((m) => p(fill(m))));
  parts.push(`<p style="margin:24px 0 0;">${escapeHtml(c.signOff)}<br>${escapeHtml(c.signature)}</p>`);

  return `<!doctype html>
<html lang="${locale}">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="color-scheme" content="light">
<title>${escapeHtml(subject)}</title>
</head>
<body style="margin:0;padding:0;background-color:${colour.page};">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" border="0" style="background-color:${colour.page};">
<tr><td align="center" style="padding:24px 12px;">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" border="0" style="max-width:560px;background-color:${colour.white};border:1px solid ${colour.line};border-radius:10px;">
<tr><td style="padding:32px 32px 8px;${font}font-size:16px;line-height:1.6;color:${colour.text};">
${parts.join('\n')}
</td></tr>
<tr><td style="padding:16px 32px 32px;${font}font-size:13px;line-height:1.5;color:${colour.muted};">${escapeHtml(c.footer)}</td></tr>
</table>
</td></tr>
</table>
</body>
</html>
`;
}

export function renderMail<T extends MailTemplate>(template: T, locale: string, data: MailTemplateData[T]): RenderedMail {
  const lang = resolveMailLocale(locale);
  const messages = catalogues[lang];
  const t: TemplateMessages | undefined = messages.templates[template];
  if (!t) throw new MailRenderError(`Unknown mail template "${template}"`);
  const values = formatValues(lang, messages, data as Record<string, unknown>);
  const linkField: string | null = ACTION_LINK[template];
  const link = linkField ? (values[linkField] ?? null) : null;
  if (linkField && !link) throw new MailRenderError(`Mail template "${template}" needs "${linkField}"`);
  // header values must stay on one line whatever a name contains
  const subject = interpolate(t.subject, values, plain).replace(/[\r\n]+/g, ' ').trim();
  return {
    subject,
    text: renderText(t, messages.common, values, link),
    html: renderHtml(lang, subject, t, messages.common, values, link),
  };
}
