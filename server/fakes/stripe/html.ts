/**
 * HTML for the stand-in's pages: an `html` template tag that escapes every interpolated
 * value (nested `html` fragments and arrays of them pass through), and the shared layout.
 */
import { formatCents } from '@domain/plans';

export class SafeHtml {
  constructor(readonly value: string) {}
  toString(): string {
    return this.value;
  }
}

export function escapeHtml(value: string): string {
  return value.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

function render(value: unknown): string {
  if (value instanceof SafeHtml) return value.value;
  if (Array.isArray(value)) return value.map(render).join('');
  if (value === null || value === undefined || value === false) return '';
  if (typeof value === 'string') return escapeHtml(value);
  if (typeof value === 'number' || typeof value === 'boolean') return String(value);
  return escapeHtml(JSON.stringify(value));
}

export function html(strings: TemplateStringsArray, ...values: unknown[]): SafeHtml {
  let out = strings[0] ?? '';
  values.forEach((value, i) => {
    out += render(value) + (strings[i + 1] ?? '');
  });
  return new SafeHtml(out);
}

export function money(cents: number, currency: string): string {
  return formatCents(cents, currency.toUpperCase());
}

const DATE = new Intl.DateTimeFormat('en-US', { dateStyle: 'long', timeZone: 'UTC' });

export function day(unixSeconds: number): string {
  return DATE.format(new Date(unixSeconds * 1000));
}

const STYLE = `
*{box-sizing:border-box}
body{margin:0;font:16px/1.5 system-ui,-apple-system,"Segoe UI",Roboto,sans-serif;color:#1f2328;background:#f3f4f6}
.test-banner{background:#fff4d6;border-bottom:1px solid #e5c77a;padding:.6rem 1rem;text-align:center;font-weight:600}
main{max-width:40rem;margin:2rem auto;padding:1.5rem;background:#fff;border:1px solid #d0d7de;border-radius:8px}
h1{font-size:1.4rem;margin:0 0 1rem}
h2{font-size:1.1rem;margin:1.5rem 0 .5rem}
dl{display:grid;grid-template-columns:max-content 1fr;gap:.35rem 1rem;margin:0 0 1rem}
dt{color:#57606a}
dd{margin:0}
label{display:block;font-weight:600;margin-bottom:.25rem}
input,select{font:inherit;padding:.5rem;border:1px solid #8c959f;border-radius:6px;width:100%;max-width:22rem}
button{font:inherit;padding:.55rem 1rem;border-radius:6px;border:1px solid #1f2328;background:#1f2328;color:#fff;cursor:pointer}
button.secondary{background:#fff;color:#1f2328}
button.danger{background:#fff;color:#a40e26;border-color:#a40e26}
button:focus-visible,a:focus-visible,input:focus-visible,select:focus-visible{outline:3px solid #0969da;outline-offset:2px}
form{margin:0 0 1rem}
.row{display:flex;flex-wrap:wrap;gap:.75rem;align-items:flex-end}
.hint{color:#57606a;font-size:.9rem;margin:.25rem 0 1rem}
.alert{border:1px solid #a40e26;background:#fff0f0;color:#a40e26;padding:.6rem .8rem;border-radius:6px;margin:0 0 1rem}
.notice{border:1px solid #1a7f37;background:#effbf1;color:#1a7f37;padding:.6rem .8rem;border-radius:6px;margin:0 0 1rem}
table{border-collapse:collapse;width:100%}
th,td{text-align:left;padding:.4rem .5rem;border-bottom:1px solid #d0d7de}
a{color:#0969da}
footer{text-align:center;color:#57606a;font-size:.85rem;margin-bottom:2rem}
`;

export function page(title: string, body: SafeHtml): string {
  return html`<!doctype html>
    <html lang="en">
      <head>
        <meta charset="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <meta name="robots" content="noindex" />
        <title>${title}</title>
        <style>
          ${new SafeHtml(STYLE)}
        </style>
      </head>
      <body>
        <div class="test-banner" role="note">Test payment page — no real money moves</div>
        <main>${body}</main>
        <footer>Mullion’s local billing stand-in, for development and tests.</footer>
      </body>
    </html> `.value;
}
