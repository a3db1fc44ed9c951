import { formatMoney } from '@kilocycle/common/money';
import { groupedCardNumber, TEST_CARDS } from './test-cards.js';

/** What the hosted pages show of a checkout session. */
export type PageSession = {
  id: string;
  amountTotal: number;
  currency: string;
  lines: Array<{ name: string; quantity: number; amount: number }>;
  cancelUrl: string | null;
};

export type CardForm = { cardNumber: string; expiry: string; cvc: string; name: string };
export type FieldName = keyof CardForm;

const NOTICE = 'Local test payment page — no real card is charged';

const FIELDS: Array<{ name: FieldName; id: string; label: string; autocomplete: string; inputmode: string; hint?: string }> = [
  { name: 'cardNumber', id: 'card-number', label: 'Card number', autocomplete: 'cc-number', inputmode: 'numeric', hint: 'Spaces are allowed.' },
  { name: 'expiry', id: 'expiry', label: 'Expiry date (MM/YY)', autocomplete: 'cc-exp', inputmode: 'numeric' },
  { name: 'cvc', id: 'cvc', label: 'Security code (CVC)', autocomplete: 'cc-csc', inputmode: 'numeric' },
  { name: 'name', id: 'name', label: 'Name on card', autocomplete: 'cc-name', inputmode: 'text' },
];

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);
}

function layout(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<style>
  body { margin: 0; font: 16px/1.5 system-ui, sans-serif; color: #1b1f24; background: #eef1f4; }
  .notice { margin: 0; padding: 0.75rem 1rem; background: #5a3e00; color: #fff; font-weight: 600; text-align: center; }
  main { box-sizing: border-box; width: min(28rem, calc(100% - 1.5rem)); margin: 1.5rem auto; padding: 1.25rem; background: #fff; border: 1px solid #c5ccd3; border-radius: 6px; }
  h1 { font-size: 1.35rem; margin: 0 0 0.75rem; }
  table { width: 100%; border-collapse: collapse; margin-bottom: 1rem; }
  caption { text-align: left; }
  td, th { padding: 0.25rem 0; text-align: left; vertical-align: top; }
  td.amount { text-align: right; white-space: nowrap; }
  tfoot th, tfoot td { border-top: 1px solid #c5ccd3; padding-top: 0.5rem; }
  label { display: block; font-weight: 600; margin-top: 0.75rem; }
  .hint { display: block; font-size: 0.875rem; color: #4a525a; }
  input { box-sizing: border-box; width: 100%; padding: 0.5rem; font: inherit; border: 1px solid #6b747c; border-radius: 4px; }
  input[aria-invalid="true"] { border: 2px solid #a4161a; }
  .error { margin: 1rem 0 0; padding: 0.75rem; border-left: 4px solid #a4161a; background: #fbeaea; color: #6f0f12; }
  .buttons { display: flex; gap: 0.75rem; flex-wrap: wrap; align-items: center; margin-top: 1.25rem; }
  button { font: inherit; font-weight: 600; padding: 0.6rem 1.2rem; border-radius: 4px; border: 1px solid #1d4f7a; background: #1d4f7a; color: #fff; cursor: pointer; }
  button.secondary { background: #fff; color: #1d4f7a; }
  a { color: #1d4f7a; }
  details { margin-top: 1.25rem; font-size: 0.9rem; }
  code { font-size: 0.95em; }
</style>
</head>
<body>
<p class="notice" role="note">${NOTICE}</p>
<main>
${body}
</main>
</body>
</html>
`;
}

function summary(session: PageSession): string {
  const money = (minor: number) => escapeHtml(formatMoney(minor, session.currency.toUpperCase()));
  const rows = session.lines
    .map((line) => `<tr><td>${escapeHtml(line.name)}${line.quantity === 1 ? '' : ` × ${line.quantity}`}</td><td class="amount">${money(line.amount)}</td></tr>`)
    .join('\n');
  return `<table>
<caption class="hint">What you are paying for</caption>
<tbody>
${rows}
</tbody>
<tfoot><tr><th scope="row">Amount to pay</th><td class="amount"><strong>${money(session.amountTotal)}</strong></td></tr></tfoot>
</table>`;
}

/** The card form; `error` (with the field it concerns, if any) is shown above the form and announced. */
export function paymentPage(session: PageSession, values: Partial<CardForm> = {}, error?: { message: string; field?: FieldName }): string {
  const errorBlock = error ? `<p class="error" id="form-error" role="alert">${escapeHtml(error.message)}</p>` : '';
  const inputs = FIELDS.map((field) => {
    const invalid = error?.field === field.name;
    const described = [field.hint ? `${field.id}-hint` : '', invalid ? 'form-error' : ''].filter(Boolean).join(' ');
    return `<label for="${field.id}">${field.label}</label>
${field.hint ? `<span class="hint" id="${field.id}-hint">${field.hint}</span>` : ''}
<input id="${field.id}" name="${field.name}" type="text" required autocomplete="${field.autocomplete}" inputmode="${field.inputmode}"\
 value="${escapeHtml(values[field.name] ?? '')}"${described ? ` aria-describedby="${described}"` : ''}${invalid ? ' aria-invalid="true"' : ''}>`;
  }).join('\n');
  const cancel = session.cancelUrl ? `<a href="${escapeHtml(session.cancelUrl)}">Cancel and go back</a>` : '';
  const cards = TEST_CARDS.map((card) => `<li><code>${groupedCardNumber(card.number)}</code> ${card.label}</li>`).join('\n');
  return layout(
    'Pay by card — local test payment page',
    `<h1>Pay by card</h1>
${summary(session)}
${errorBlock}
<form method="post" action="/pay/${escapeHtml(session.id)}" novalidate>
${inputs}
<div class="buttons"><button type="submit">Pay ${escapeHtml(formatMoney(session.amountTotal, session.currency.toUpperCase()))}</button>${cancel}</div>
</form>
<details>
<summary>Test card numbers</summary>
<p>Any future expiry date, any three digits as the security code.</p>
<ul>
${cards}
</ul>
</details>`,
  );
}

/** The extra confirmation step some cards ask for. */
export function confirmPage(session: PageSession): string {
  return layout(
    'Confirm the payment — local test payment page',
    `<h1>Confirm the payment</h1>
${summary(session)}
<p>Your card issuer asks you to confirm this payment. Here you choose what the issuer answers.</p>
<form method="post" action="/pay/${escapeHtml(session.id)}/confirm">
<div class="buttons">
<button type="submit" name="outcome" value="complete">Complete</button>
<button type="submit" name="outcome" value="fail" class="secondary">Fail</button>
</div>
</form>`,
  );
}

export function messagePage(title: string, text: string, link?: { href: string; label: string }): string {
  return layout(
    title,
    `<h1>${escapeHtml(title)}</h1>\n<p>${escapeHtml(text)}</p>${link ? `\n<p><a href="${escapeHtml(link.href)}">${escapeHtml(link.label)}</a></p>` : ''}`,
  );
}
