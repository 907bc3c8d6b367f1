/** The style sheet of the HTML report, inlined in every page. */
export const reportCss = `
:root { --text: #1f2328; --muted: #57606a; --line: #d0d7de; --soft: #f6f8fa; --accent: #0072b2;
  --pass: #1a7f37; --fail: #cf222e; --warn-bg: #fff8e6; --warn-line: #d4a72c; }
* { box-sizing: border-box; }
html { -webkit-text-size-adjust: 100%; }
body { margin: 0 auto; max-width: 1080px; padding: 32px 28px 48px; overflow-wrap: break-word; color: var(--text); background: #fff;
  font: 15px/1.5 system-ui, -apple-system, "Segoe UI", Roboto, "DejaVu Sans", Arial, sans-serif; }
h1 { font-size: 26px; line-height: 1.25; margin: 0 0 4px; letter-spacing: -0.01em; }
h2 { font-size: 20px; margin: 40px 0 12px; padding-bottom: 6px; border-bottom: 1px solid var(--line); }
h3 { font-size: 15px; margin: 18px 0 6px; color: var(--muted); text-transform: uppercase; letter-spacing: 0.04em; }
p { margin: 8px 0; max-width: 72ch; }
.subtitle { color: var(--muted); margin: 0 0 12px; }
dl.meta { display: flex; flex-wrap: wrap; gap: 4px 28px; margin: 12px 0 16px; font-size: 14px; }
dl.meta div { display: flex; gap: 6px; }
dl.meta dt { color: var(--muted); }
dl.meta dd { margin: 0; font-weight: 500; }
.caution { background: var(--warn-bg); border-left: 4px solid var(--warn-line); padding: 10px 14px; margin: 16px 0;
  font-size: 14px; border-radius: 0 4px 4px 0; }
nav ol { margin: 8px 0 0; padding-left: 22px; columns: 2; font-size: 14px; }
nav a { color: var(--accent); text-decoration: none; }
table { border-collapse: collapse; margin: 10px 0 18px; font-size: 14px; min-width: 50%; max-width: 100%; }
.table-wrap { max-width: 100%; overflow-x: auto; }
caption { text-align: left; font-weight: 600; padding: 0 0 6px; }
th, td { padding: 5px 12px 5px 0; border-bottom: 1px solid var(--line); text-align: left; vertical-align: top;
  overflow-wrap: anywhere; }
th { font-weight: 600; color: var(--muted); border-bottom: 2px solid var(--line); overflow-wrap: normal; }
td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; }
td.num { white-space: nowrap; }
tbody tr:nth-child(even) td { background: var(--soft); }
.plots { display: grid; grid-template-columns: repeat(auto-fit, minmax(min(100%, 440px), 1fr)); gap: 18px;
  margin: 12px 0 20px; align-items: start; }
.plots > *, .inputs > * { min-width: 0; }
.plots figure { margin: 0; padding: 8px; border: 1px solid var(--line); border-radius: 6px; background: #fff; }
.plots svg { display: block; width: 100%; height: auto; }
ul.checks { list-style: none; padding: 0; margin: 10px 0 18px; }
ul.checks li { padding: 4px 0; }
.badge { display: inline-block; min-width: 42px; text-align: center; font-size: 12px; font-weight: 700;
  border-radius: 10px; padding: 1px 8px; color: #fff; text-transform: uppercase; letter-spacing: 0.03em; }
li.pass .badge { background: var(--pass); }
li.fail .badge { background: var(--fail); }
.detail { color: var(--muted); }
.inputs { display: grid; grid-template-columns: repeat(auto-fit, minmax(min(100%, 380px), 1fr)); gap: 0 28px; }
.inputs table { width: 100%; }
.inputs td:nth-child(3) { white-space: nowrap; }
.keep { display: flow-root; }
@media (max-width: 600px) {
  body { padding: 20px 12px 32px; font-size: 14px; }
  table { font-size: 13px; }
  th, td { padding-right: 8px; }
  nav ol { columns: 1; }
  /* Tables of four or more columns, row by row: each cell under its column's heading. */
  table.stack { width: 100%; }
  table.stack caption { display: block; }
  table.stack thead { display: none; }
  table.stack, table.stack tbody, table.stack tr { display: block; }
  table.stack tr { border-bottom: 1px solid var(--line); padding: 6px 0; }
  table.stack td { display: flex; gap: 10px; border: 0; padding: 1px 0; text-align: left; background: none !important; }
  table.stack td::before { content: attr(data-label); flex: 0 0 38%; color: var(--muted); }
  table.stack td:first-child { font-weight: 600; }
  table.stack td:first-child::before { content: none; }
  table.stack td:empty { display: none; }
}
footer { margin-top: 48px; padding-top: 12px; border-top: 1px solid var(--line); color: var(--muted); font-size: 13px; }
@media print {
  @page { margin: 14mm 12mm; }
  body { max-width: none; padding: 0; font-size: 9.5pt; }
  table { font-size: 8.5pt; }
  h2 { margin-top: 20px; }
  h2, h3, caption { break-after: avoid; }
  .keep, .input-group, .plots figure, table, .caution, ul.checks { break-inside: avoid; }
  .plots { grid-template-columns: 1fr 1fr; gap: 10px; }
  .inputs { grid-template-columns: 1fr 1fr; }
  nav { display: none; }
  a { color: inherit; }
}
`.trim();
