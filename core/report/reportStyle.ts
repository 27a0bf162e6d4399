// The inline style sheet of the HTML report: quiet, readable on screen, and printable on A4 or letter.

export const REPORT_CSS = `
:root { --ink: #1f2328; --muted: #5b6470; --rule: #d9dde3; --soft: #f5f6f8; --pass: #00694d; --pass-bg: #e3f4ee; --fail: #a33a00; --fail-bg: #fbe9df; --none: #4b5563; --none-bg: #eceef1; --accent: #0072b2; }
* { box-sizing: border-box; }
html { -webkit-text-size-adjust: 100%; }
body { margin: 0; color: var(--ink); background: #fff; font: 14px/1.5 system-ui, -apple-system, "Segoe UI", Roboto, "Helvetica Neue", Arial, sans-serif; }
main { max-width: 980px; margin: 0 auto; padding: 32px 28px 48px; }
h1 { font-size: 26px; margin: 0 0 4px; letter-spacing: -0.01em; }
h2 { font-size: 19px; margin: 36px 0 12px; padding-bottom: 6px; border-bottom: 2px solid var(--ink); display: flex; align-items: center; gap: 12px; }
h3 { font-size: 15px; margin: 0 0 2px; }
p { margin: 6px 0; }
a { color: #0b5d91; text-decoration: none; }
a:hover { text-decoration: underline; }
code, .mono { font-family: ui-monospace, SFMono-Regular, Menlo, Consolas, monospace; font-size: 12.5px; }
.meta, .byline, .rule, figcaption, .fineprint { color: var(--muted); font-size: 12.5px; }
.tiles { display: flex; gap: 12px; margin: 12px 0 16px; flex-wrap: wrap; }
.tile { flex: 1 1 140px; border: 1px solid var(--rule); border-radius: 6px; padding: 10px 14px; background: var(--soft); }
.tile .value { font-size: 24px; font-weight: 650; font-variant-numeric: tabular-nums; }
.tile .label { color: var(--muted); font-size: 12px; text-transform: uppercase; letter-spacing: 0.04em; }
table { border-collapse: collapse; width: 100%; font-variant-numeric: tabular-nums; }
th, td { text-align: left; padding: 5px 10px 5px 0; border-bottom: 1px solid var(--rule); vertical-align: top; }
table.results th, table.transitions tbody th { text-transform: none; letter-spacing: 0; font-size: 14px; color: var(--muted); font-weight: 500; width: 12%; }
table.results td { width: 38%; }
table.transitions { width: auto; }
table.transitions th, table.transitions td { padding-right: 32px; }
table.transitions tbody th { width: auto; white-space: nowrap; }
th { font-size: 12px; color: var(--muted); font-weight: 600; text-transform: uppercase; letter-spacing: 0.03em; }
tfoot td { font-weight: 600; border-bottom: none; border-top: 2px solid var(--ink); }
td.num { white-space: nowrap; }
td.num .interval { display: block; color: var(--muted); font-size: 11.5px; }
.badge { display: inline-block; font-size: 12px; font-weight: 650; padding: 1px 8px; border-radius: 10px; white-space: nowrap; letter-spacing: 0.02em; }
.badge.pass { color: var(--pass); background: var(--pass-bg); }
.badge.fail { color: var(--fail); background: var(--fail-bg); }
.badge.not-checked { color: var(--none); background: var(--none-bg); }
.measurement { margin: 18px 0 28px; padding: 16px 18px; border: 1px solid var(--rule); border-radius: 8px; }
.measurement-head { display: flex; justify-content: space-between; align-items: baseline; gap: 12px; flex-wrap: wrap; }
figure { margin: 14px 0 8px; }
figure svg { display: block; max-width: 100%; height: auto; }
.block h4 { margin: 8px 0 4px; font-size: 12.5px; text-transform: uppercase; letter-spacing: 0.04em; color: var(--muted); }
.block { margin-top: 12px; }
ul { margin: 4px 0; padding-left: 20px; }
li { margin: 2px 0; }
.caution { border-left: 3px solid var(--fail); padding: 4px 10px; margin: 6px 0; background: #fff8f4; }
.caution ul { list-style: none; padding: 0; margin: 4px 0 0; }
.caution li { margin: 4px 0; display: grid; grid-template-columns: 72px minmax(0, 1fr); column-gap: 6px; }
.caution .threshold { font-weight: 600; font-variant-numeric: tabular-nums; }
.caution .source { display: block; color: var(--muted); font-size: 12px; }
.warning { color: #7a4b00; }
.notice { border: 1px solid #e7c9a9; background: #fff8f0; border-radius: 6px; padding: 8px 12px; margin: 10px 0; }
.reproduce { margin-top: 12px; padding: 8px 12px; background: var(--soft); border-radius: 6px; font-size: 12.5px; }
.reproduce code { word-break: break-all; }
.deferral { margin-top: 14px; font-weight: 600; }
footer { margin-top: 40px; padding-top: 10px; border-top: 1px solid var(--rule); }
@media (max-width: 760px) { main { padding: 20px 14px; } }
@page { size: auto; margin: 14mm 12mm; }
@media print {
  body { font-size: 10pt; }
  main { max-width: none; padding: 0; }
  h2 { break-after: avoid; margin-top: 18px; }
  .measurement { break-inside: avoid; border-color: #bbb; }
  .tile, .reproduce, .caution, .badge { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
  a { color: inherit; text-decoration: none; }
}
`;
