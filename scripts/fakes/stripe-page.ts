/**
 * HTML for the local Stripe fake's hosted payment page (`/pay/:id`). Our own plain design: it only
 * has to show what is being paid for, take a test card, and say clearly that no money moves.
 */

export interface PageLine { name: string, quantity: number, unitAmount: number, amount: number }

export interface PayPageView {
  sessionId: string
  lines: PageLine[]
  total: number
  currency: string
  customerEmail: string | null
  cancelUrl: string | null
  /** Shown above the form after a failed attempt. */
  error?: string
  /** What the guest typed, put back after a failed attempt (the CVC never is). */
  values?: { name?: string, card?: string, expiry?: string }
}

export interface StatusPageView { title: string, message: string, link?: { href: string, label: string } }

export const escapeHtml = (s: string) => s.replace(/[&<>"']/g, c => `&#${c.charCodeAt(0)};`)

/** Minor units → a formatted amount, using the currency's own number of fraction digits (0 for JPY, 3 for KWD). */
export function formatAmount(minor: number, currency: string): string {
  const fmt = new Intl.NumberFormat('en', { style: 'currency', currency: currency.toUpperCase() })
  const digits = fmt.resolvedOptions().maximumFractionDigits ?? 2
  return fmt.format(minor / 10 ** digits)
}

const STYLE = `
  *{box-sizing:border-box}
  body{font:16px/1.5 system-ui,sans-serif;margin:0;background:#f4f1ea;color:#1e2326}
  .banner{background:#2f3b45;color:#fff;padding:.6rem 1rem;text-align:center;font-size:14px}
  .banner strong{letter-spacing:.02em}
  main{max-width:30rem;margin:2rem auto;padding:0 1rem}
  .panel{background:#fff;border:1px solid #ddd6c8;border-radius:10px;padding:1.25rem 1.5rem;margin-bottom:1rem}
  h1{font-size:1.3rem;margin:0 0 .75rem}
  table{width:100%;border-collapse:collapse}
  td{padding:.35rem 0;vertical-align:top}
  td.num{text-align:right;white-space:nowrap}
  .sub{color:#6b757b;font-size:14px}
  tr.total td{border-top:1px solid #ddd6c8;padding-top:.6rem;font-weight:600}
  label{display:block;font-size:14px;font-weight:600;margin:.75rem 0 .25rem}
  input{width:100%;font:inherit;padding:.5rem .6rem;border:1px solid #b9b2a5;border-radius:6px}
  input:focus{outline:2px solid #2f6f8f;outline-offset:1px}
  .row{display:flex;gap:.75rem}.row>div{flex:1}
  button{margin-top:1.1rem;width:100%;font:inherit;font-weight:600;padding:.65rem;border:0;border-radius:6px;background:#2f6f8f;color:#fff;cursor:pointer}
  button:hover{background:#275d78}
  .error{background:#fbeaea;border:1px solid #d9a3a3;color:#7a1f1f;border-radius:6px;padding:.6rem .8rem;margin-bottom:1rem}
  .note{font-size:14px;color:#4a5459}
  .note ul{margin:.3rem 0 0;padding-left:1.2rem}
  code{font:14px ui-monospace,monospace;background:#f1ede4;padding:0 .25rem;border-radius:3px}
  a{color:#2f6f8f}
`

function shell(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)} (local test payment)</title><style>${STYLE}</style></head>
<body><div class="banner" role="note"><strong>Local test payment page.</strong> No real money moves and no card is charged: this page is served by a development stand-in for Stripe.</div>
<main>${body}</main></body></html>`
}

export function renderPayPage(v: PayPageView): string {
  const money = (n: number) => escapeHtml(formatAmount(n, v.currency))
  const rows = v.lines.map(l => `<tr><td>${escapeHtml(l.name)}<div class="sub">${l.quantity} × ${money(l.unitAmount)}</div></td><td class="num">${money(l.amount)}</td></tr>`).join('')
  const val = (k: 'name' | 'card' | 'expiry') => escapeHtml(v.values?.[k] ?? '')
  const cancel = v.cancelUrl ? `<p><a href="${escapeHtml(v.cancelUrl)}">Cancel and go back</a></p>` : ''
  return shell('Pay', `
<section class="panel" aria-labelledby="summary">
  <h1 id="summary">Your order</h1>
  <table>${rows}<tr class="total"><td>Total</td><td class="num" data-total>${money(v.total)}</td></tr></table>
  ${v.customerEmail ? `<p class="sub">Receipt to ${escapeHtml(v.customerEmail)}</p>` : ''}
</section>
<section class="panel" aria-labelledby="card">
  <h1 id="card">Card details</h1>
  ${v.error ? `<div class="error" role="alert">${escapeHtml(v.error)}</div>` : ''}
  <form method="post" action="/pay/${encodeURIComponent(v.sessionId)}">
    <label for="name">Name on card</label>
    <input id="name" name="name" autocomplete="cc-name" value="${val('name')}" required>
    <label for="cardnumber">Card number</label>
    <input id="cardnumber" name="card" inputmode="numeric" autocomplete="cc-number" placeholder="4242 4242 4242 4242" value="${val('card')}" required>
    <div class="row">
      <div><label for="expiry">Expiry (MM/YY)</label><input id="expiry" name="expiry" autocomplete="cc-exp" placeholder="12/34" value="${val('expiry')}" required></div>
      <div><label for="cvc">CVC</label><input id="cvc" name="cvc" inputmode="numeric" autocomplete="cc-csc" placeholder="123" required></div>
    </div>
    <button type="submit">Pay ${money(v.total)}</button>
  </form>
</section>
<section class="note" aria-label="Test cards">
  <p><strong>Test cards</strong> (any future expiry, any 3-digit CVC):</p>
  <ul>
    <li><code>4242 4242 4242 4242</code> succeeds</li>
    <li><code>4000 0000 0000 0002</code> is declined</li>
  </ul>
  ${cancel}
</section>`)
}

export function renderStatusPage(v: StatusPageView): string {
  const link = v.link ? `<p><a href="${escapeHtml(v.link.href)}">${escapeHtml(v.link.label)}</a></p>` : ''
  return shell(v.title, `<section class="panel" role="status"><h1>${escapeHtml(v.title)}</h1><p>${escapeHtml(v.message)}</p>${link}</section>`)
}
