// The fake's own payment page: a plain, accessible form that says clearly it is a local test page
// and takes only the documented test card numbers. Its look is Emberline's neutral one.
import { currencyExponent, toMajorString } from '@emberline/domain';
import { groupCardNumber, TEST_CARDS } from './test-cards';
import type { WireObject } from './store';

const escape = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/** Minor units as money, e.g. 12345 eur → "€123.45"; the exponent comes from the currency. */
export function formatMinor(amount: number, currency: string): string {
  const code = currency.toUpperCase();
  const digits = currencyExponent(code);
  const format = new Intl.NumberFormat('en-GB', { style: 'currency', currency: code, minimumFractionDigits: digits, maximumFractionDigits: digits });
  return format.format(toMajorString(amount, code) as Intl.StringNumericLiteral);
}

export interface PageState {
  session: WireObject;
  values?: { number?: string; expiry?: string; cvc?: string };
  /** A problem with one field (unknown card number, bad expiry…). */
  fieldError?: { field: 'number' | 'expiry' | 'cvc'; message: string };
  /** The card was declined. */
  declined?: { message: string; declineCode: string };
}

const STYLE = `
  :root { color-scheme: light; --ink: #1f2328; --muted: #57606a; --line: #d0d7de; --accent: #8a3b12; --bad: #a40e26; }
  * { box-sizing: border-box; }
  body { margin: 0; font: 16px/1.5 system-ui, sans-serif; color: var(--ink); background: #f6f8fa; }
  main { max-width: 30rem; margin: 2rem auto; padding: 1.5rem; background: #fff; border: 1px solid var(--line); border-radius: 8px; }
  h1 { font-size: 1.4rem; margin: 0 0 .25rem; }
  .notice { border: 2px dashed var(--accent); padding: .75rem; border-radius: 6px; margin: 1rem 0; }
  .notice p { margin: 0 0 .5rem; }
  .notice ul { margin: 0; padding-left: 1.2rem; }
  .amount { font-size: 1.6rem; font-weight: 700; margin: .25rem 0; }
  .items { color: var(--muted); margin: 0 0 1rem; padding-left: 1.2rem; }
  label { display: block; font-weight: 600; margin-top: 1rem; }
  .hint { display: block; font-weight: 400; color: var(--muted); font-size: .9rem; }
  input { width: 100%; font: inherit; padding: .5rem .6rem; border: 1px solid #8c959f; border-radius: 6px; }
  input[aria-invalid="true"] { border: 2px solid var(--bad); }
  .row { display: flex; gap: 1rem; } .row > div { flex: 1; }
  .field-error { color: var(--bad); font-weight: 600; margin: .25rem 0 0; }
  .alert { border: 2px solid var(--bad); color: var(--bad); padding: .75rem; border-radius: 6px; margin: 1rem 0; font-weight: 600; }
  .alert p { margin: 0 0 .5rem; } .alert p:last-child { margin-bottom: 0; }
  button { margin-top: 1.5rem; width: 100%; font: inherit; font-weight: 700; padding: .7rem; border: 0; border-radius: 6px; background: var(--accent); color: #fff; cursor: pointer; }
  a { color: var(--accent); }
  :focus-visible { outline: 3px solid #0969da; outline-offset: 2px; }
  .actions { margin-top: 1rem; text-align: center; }
`;

function layout(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="robots" content="noindex">
<title>${escape(title)} — local test payment page</title>
<style>${STYLE}</style>
</head>
<body>
<main>
${body}
</main>
</body>
</html>`;
}

const testNotice = () => `
<section class="notice" aria-labelledby="test-notice-title">
  <p id="test-notice-title"><strong>Local test payment page.</strong> No money moves: this page stands in for the payments provider during development and tests.</p>
  <p>Use a test card with any future expiry date and any three-digit CVC:</p>
  <ul>
    ${TEST_CARDS.map((c) => `<li><span class="card">${groupCardNumber(c.number)}</span> — ${escape(c.label)}</li>`).join('\n    ')}
  </ul>
</section>`;

function summary(session: WireObject): string {
  const items = (session._line_items as { description: string; quantity: number; price: { product: { description: string | null } } }[]) ?? [];
  return `
<p class="amount">${escape(formatMinor(session.amount_total as number, session.currency as string))}</p>
<ul class="items">
  ${items.map((li) => `<li>${escape(li.description)}${li.quantity > 1 ? ` × ${li.quantity}` : ''}${li.price.product.description ? ` — ${escape(li.price.product.description)}` : ''}</li>`).join('\n  ')}
</ul>`;
}

function field(o: { id: 'number' | 'expiry' | 'cvc'; label: string; hint: string; autocomplete: string; value?: string; error?: PageState['fieldError']; size?: number; pattern?: string }): string {
  const err = o.error?.field === o.id ? o.error.message : undefined;
  const describedBy = [`${o.id}-hint`, err ? `${o.id}-error` : ''].filter(Boolean).join(' ');
  return `<label for="${o.id}">${o.label} <span class="hint" id="${o.id}-hint">${o.hint}</span></label>
  <input id="${o.id}" name="${o.id}" inputmode="numeric" autocomplete="${o.autocomplete}" required value="${escape(o.value ?? '')}" aria-describedby="${describedBy}"${err ? ' aria-invalid="true"' : ''}>
  ${err ? `<p class="field-error" id="${o.id}-error">${escape(err)}</p>` : ''}`;
}

export function renderPaymentForm(state: PageState): string {
  const { session, values = {}, fieldError, declined } = state;
  const cancelUrl = session.cancel_url as string | null;
  const amount = formatMinor(session.amount_total as number, session.currency as string);
  const declinedBox = declined
    ? `<div class="alert" role="alert">
  <p>Payment declined: ${escape(declined.message)} (${escape(declined.declineCode.replace(/_/g, ' '))})</p>
  <p>Try another card${cancelUrl ? `, or <a href="${escape(cancelUrl)}">go back to the shop</a>` : ''}.</p>
</div>`
    : '';
  // the message itself stands under its field; the alert points there
  const fieldLabel = { number: 'card number', expiry: 'expiry date', cvc: 'security code' }[fieldError?.field ?? 'number'];
  const fieldBox = fieldError ? `<div class="alert" role="alert"><p>Please check the <a href="#${fieldError.field}">${fieldLabel}</a> below.</p></div>` : '';
  return layout(`Pay ${amount}`, `
<h1>Payment</h1>
${summary(session)}
${testNotice()}
${declinedBox}${fieldBox}
<form method="post" action="/pay/${escape(session.id)}" novalidate>
  ${field({ id: 'number', label: 'Card number', hint: '16 digits, spaces allowed', autocomplete: 'cc-number', value: values.number, error: fieldError })}
  <div class="row">
    <div>${field({ id: 'expiry', label: 'Expiry date', hint: 'MM/YY', autocomplete: 'cc-exp', value: values.expiry, error: fieldError })}</div>
    <div>${field({ id: 'cvc', label: 'Security code (CVC)', hint: '3 or 4 digits', autocomplete: 'cc-csc', value: values.cvc, error: fieldError })}</div>
  </div>
  <button type="submit">Pay ${escape(amount)}</button>
</form>
${cancelUrl ? `<p class="actions"><a href="${escape(cancelUrl)}">Cancel and go back to the shop</a></p>` : ''}`);
}

export function renderClosed(session: WireObject, message: string): string {
  const cancelUrl = session.cancel_url as string | null;
  const successUrl = (session.success_url as string).replaceAll('{CHECKOUT_SESSION_ID}', session.id);
  const back = session.status === 'complete' ? successUrl : cancelUrl;
  return layout(message, `
<h1>${escape(message)}</h1>
${summary(session)}
${testNotice()}
${back ? `<p class="actions"><a href="${escape(back)}">Back to the shop</a></p>` : ''}`);
}

export function renderNotFound(): string {
  return layout('Payment not found', `
<h1>Payment not found</h1>
<p>There is no payment with this link on the local test payment page. It may have been reset.</p>`);
}
