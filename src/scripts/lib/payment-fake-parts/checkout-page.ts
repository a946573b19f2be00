/** The fake's hosted checkout page: our own plain look, clearly marked as a local test tool. */
import { formatMinor } from '../../../lib/payments/money';
import type { FakeSession } from './sessions';

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

const STYLE = `body{margin:0;font-family:system-ui,sans-serif;background:#eef1f4;color:#16202b}
.band{background:#16202b;color:#eef1f4;padding:10px 20px;font-size:13px;letter-spacing:.04em}
main{max-width:760px;margin:32px auto;display:grid;grid-template-columns:1fr 1fr;gap:24px;padding:0 16px}
@media(max-width:700px){main{grid-template-columns:1fr}}
section{background:#fff;border:1px solid #c9d1da;border-radius:6px;padding:20px}
h1{font-size:18px;margin:0 0 4px}h2{font-size:15px;margin:0 0 12px}
table{width:100%;border-collapse:collapse;font-size:14px}td{padding:6px 0;border-bottom:1px solid #e3e8ee}
td.n{text-align:right;font-variant-numeric:tabular-nums}tfoot td{font-weight:600;border-bottom:0}
label{display:block;font-size:13px;font-weight:600;margin:10px 0 4px}
input{width:100%;box-sizing:border-box;padding:8px;border:1px solid #9aa7b4;border-radius:4px;font-size:15px}
.row{display:flex;gap:12px}.row>div{flex:1}
button{margin-top:16px;width:100%;padding:10px;border-radius:4px;border:1px solid #16202b;font-size:15px;cursor:pointer}
.pay{background:#2d5f8a;color:#fff;border-color:#2d5f8a}.cancel{background:#fff;color:#16202b}
.msg{border-left:4px solid #a33;background:#fbeeee;padding:8px 10px;margin-bottom:10px;font-size:14px}
.hint{font-size:12px;color:#55616d;margin-top:12px}`;

function shell(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1"><title>${esc(title)}</title><style>${STYLE}</style></head>
<body><div class="band">LOCAL TEST CHECKOUT · no money moves · payment fake for development and tests</div>${body}</body></html>`;
}

export function checkoutPage(s: FakeSession, message?: string): string {
  const items = s.line_items
    .map((li) => `<tr><td>${esc(li.name)}${li.quantity > 1 ? ` × ${li.quantity}` : ''}</td><td class="n">${esc(formatMinor(li.unit_amount * li.quantity, s.currency))}</td></tr>`)
    .join('');
  const total = formatMinor(s.amount_total, s.currency);
  return shell(
    `Pay ${total}`,
    `<main>
<section aria-labelledby="order-h"><h1 id="order-h">Order summary</h1><p style="font-size:13px;color:#55616d;margin:0 0 12px">${s.customer_email ? `for ${esc(s.customer_email)}` : ''}</p>
<table><tbody>${items}</tbody><tfoot><tr><td>Total</td><td class="n">${esc(total)}</td></tr></tfoot></table></section>
<section aria-labelledby="card-h"><h2 id="card-h">Card details</h2>
${message ? `<p class="msg" role="alert">${esc(message)}</p>` : ''}
<form method="post" action="/checkout/${esc(s.id)}/pay">
<label for="card">Card number</label><input id="card" name="card_number" inputmode="numeric" autocomplete="cc-number" placeholder="4242 4242 4242 4242" required>
<div class="row"><div><label for="exp">Expiry (MM/YY)</label><input id="exp" name="expiry" placeholder="12/30" required></div>
<div><label for="cvc">CVC</label><input id="cvc" name="cvc" inputmode="numeric" placeholder="123" required></div></div>
<button class="pay" type="submit">Pay ${esc(total)}</button></form>
<form method="post" action="/checkout/${esc(s.id)}/cancel"><button class="cancel" type="submit">Cancel and go back</button></form>
<p class="hint">Test cards: 4242 4242 4242 4242 pays; 4000 0000 0000 0002 is declined. Any future expiry and any three digits.</p>
</section></main>`,
  );
}

export function closedPage(s: FakeSession): string {
  const text = s.status === 'complete' ? 'This checkout is already paid.' : 'This checkout has expired. Start a new one from the shop that sent you here.';
  return shell('Checkout closed', `<main><section style="grid-column:1/-1"><h1>Checkout closed</h1><p>${esc(text)}</p></section></main>`);
}
