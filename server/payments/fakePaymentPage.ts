/** The local payment fake's hosted payment page: our own plain design, usable with the keyboard and on a phone. */
import { formatMoney } from '../../shared/format';

/** What the page shows. */
export interface FakePaymentPageInput {
  sessionId: string;
  email: string | null;
  currency: string;
  amountTotal: number;
  lines: Array<{ name: string; quantity: number; amountMinor: number }>;
  cancelUrl: string | null;
  /** A decline or input message to show above the form. */
  error?: string;
  /** The card number typed before the error, kept so nothing is lost. */
  cardNumber?: string;
  /** The session is no longer open (paid or expired). */
  closedText?: string;
}

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/**
 * The payment page's HTML.
 * @param input - the session and any message
 */
export function fakePaymentPage(input: FakePaymentPageInput): string {
  const money = (minor: number) => escapeHtml(formatMoney(minor, input.currency.toUpperCase()));
  const rows = input.lines
    .map((l) => `<tr><td>${l.quantity} × ${escapeHtml(l.name)}</td><td class="n">${money(l.amountMinor)}</td></tr>`)
    .join('');
  const form = input.closedText
    ? `<p class="closed" role="status">${escapeHtml(input.closedText)}</p>`
    : `<form method="post" action="/pay/${escapeHtml(input.sessionId)}" novalidate>
  ${input.error ? `<p class="error" role="alert" id="pay-error">${escapeHtml(input.error)}</p>` : ''}
  <label for="card">Card number</label>
  <input id="card" name="cardNumber" inputmode="numeric" autocomplete="cc-number" required
    value="${escapeHtml(input.cardNumber ?? '')}" placeholder="4242 4242 4242 4242"
    ${input.error ? 'aria-describedby="pay-error" aria-invalid="true" autofocus' : 'autofocus'}>
  <div class="pair">
    <div><label for="exp">Expiry (MM/YY)</label>
      <input id="exp" name="expiry" inputmode="numeric" autocomplete="cc-exp" value="12/34"></div>
    <div><label for="cvc">Security code</label>
      <input id="cvc" name="cvc" inputmode="numeric" autocomplete="cc-csc" value="123"></div>
  </div>
  <button type="submit">Pay ${money(input.amountTotal)}</button>
</form>`;
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Payment · local test provider</title>
<style>
  body { margin: 0; font: 16px/1.5 system-ui, sans-serif; background: #eef1f4; color: #1d232a; }
  main { max-width: 26rem; margin: 2rem auto; background: #fff; border: 1px solid #c9d1da; border-radius: 10px; padding: 1.5rem; }
  h1 { font-size: 1.25rem; margin: 0 0 .25rem; }
  .test { display: inline-block; font-size: .8rem; background: #fff3c4; color: #5c4300; padding: .1rem .5rem; border-radius: 4px; }
  table { width: 100%; border-collapse: collapse; margin: 1rem 0; }
  td { padding: .25rem 0; border-bottom: 1px solid #e3e8ee; } .n { text-align: right; white-space: nowrap; }
  tr.total td { font-weight: 700; border-bottom: 0; }
  label { display: block; font-weight: 600; margin-top: .75rem; }
  input { width: 100%; box-sizing: border-box; font: inherit; padding: .55rem .6rem; border: 1px solid #8895a3; border-radius: 6px; }
  input:focus, button:focus, a:focus { outline: 3px solid #2d6cdf; outline-offset: 2px; }
  .pair { display: flex; gap: .75rem; } .pair > div { flex: 1; }
  button { margin-top: 1.25rem; width: 100%; font: inherit; font-weight: 700; padding: .7rem; border: 0; border-radius: 6px; background: #1f4fb3; color: #fff; cursor: pointer; }
  .error { background: #fde8e6; color: #8a1c10; border: 1px solid #e6a49b; padding: .6rem .75rem; border-radius: 6px; }
  .closed { background: #e9f0fb; padding: .6rem .75rem; border-radius: 6px; }
  .foot { margin-top: 1rem; font-size: .9rem; } .foot a { color: #1f4fb3; }
</style></head>
<body><main>
<h1>Pay for your order</h1>
<span class="test">Local test payments: no real card is charged</span>
${input.email ? `<p>Receipt to <strong>${escapeHtml(input.email)}</strong></p>` : ''}
<table aria-label="What you pay for">${rows}<tr class="total"><td>Total</td><td class="n">${money(input.amountTotal)}</td></tr></table>
${form}
${input.cancelUrl && !input.closedText ? `<p class="foot"><a href="${escapeHtml(input.cancelUrl)}">Back to the shop without paying</a></p>` : ''}
</main></body></html>`;
}
