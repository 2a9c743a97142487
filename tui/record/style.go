package record

// style is the record's one style sheet. It carries the promises of the
// record: no horizontal scroll on a 360 px phone (values wrap, tables and
// figures never grow past the page: max-width: 100%), value tables that
// become one block a row on a narrow screen, and print on A4 and on US
// letter (an @page rule for each, chosen by the paper's width).
const style = `
:root { color-scheme: light; }
body { font-family: system-ui, -apple-system, "Segoe UI", sans-serif; line-height: 1.45; color: #1a1a1a; background: #fff;
  margin: 0 auto; padding: 0 0.75rem 2rem; max-width: 60rem; overflow-wrap: break-word; }
h1 { font-size: 1.6rem; margin: 1rem 0 0.3rem; }
h2 { font-size: 1.25rem; border-bottom: 2px solid #444; margin-top: 2rem; }
h3 { font-size: 1rem; margin: 0 0 0.3rem; font-weight: 600; }
code, pre, .val { font-family: ui-monospace, "DejaVu Sans Mono", Menlo, Consolas, monospace; font-size: 0.92em; }
code, .val { overflow-wrap: anywhere; }
.meta { color: #333; margin: 0.2rem 0; }
.step { border-top: 1px solid #bbb; padding: 0.6rem 0; }
.step.setting { padding: 0.3rem 0; }
.ln { color: #555; font-weight: normal; margin-right: 0.4rem; }
.rule { margin: 0.2rem 0; }
table { border-collapse: collapse; width: 100%; max-width: 100%; margin: 0.3rem 0; }
th, td { border-bottom: 1px solid #ccc; padding: 0.15rem 0.4rem; text-align: left; vertical-align: top; overflow-wrap: anywhere; }
thead th { border-bottom: 2px solid #888; font-weight: 600; }
tr.result th, tr.result td { font-weight: 600; }
.verdict { font-weight: 700; }
.pass .verdict { color: #0b6b2b; }
.fail .verdict { color: #a11212; }
.fail { background: #fdecec; }
figure { margin: 0.5rem 0; }
svg { max-width: 100%; height: auto; display: block; }
figcaption { font-size: 0.9em; color: #333; }
pre { white-space: pre-wrap; overflow-wrap: anywhere; background: #f4f4f4; padding: 0.4rem; max-width: 100%; }
pre.plot { white-space: pre; overflow-x: auto; overflow-wrap: normal; }
.note, .caution { margin: 0.2rem 0; }
.caution { border-left: 4px solid #b36b00; padding-left: 0.4rem; }
.safety { border: 2px solid #b36b00; padding: 0.4rem; }
@media (max-width: 36rem) {
  table.values, table.values tbody, table.values tr, table.values th, table.values td { display: block; width: auto; }
  table.values thead { display: none; }
  table.values tr { border-bottom: 1px solid #ccc; padding: 0.2rem 0; }
  table.values th, table.values td { border: 0; padding: 0 0.2rem; }
  table.values td[data-k]::before { content: attr(data-k) ": "; font-family: system-ui, sans-serif; color: #555; }
}
@page { margin: 15mm; }
@media print and (max-width: 213mm) { @page { size: A4; margin: 15mm; } }
@media print and (min-width: 213mm) { @page { size: letter; margin: 0.6in; } }
@media print {
  body { max-width: none; padding: 0; font-size: 10pt; }
  nav { display: none; }
  a { color: inherit; text-decoration: none; }
  .step, figure, tr { break-inside: avoid; }
  h2, h3 { break-after: avoid; }
  svg { max-width: 110mm; }
  pre { background: none; border: 1px solid #999; }
  pre.plot { white-space: pre-wrap; }
}
`
