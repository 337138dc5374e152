#include "postproc/report/report_style.hpp"

namespace tw::postproc {

const std::string& reportStyleSheet() {
  // The palette: slate ink, teal for seams, burnt orange for the process,
  // steel blue for joint values; soft red beyond a limit, sand within the
  // warning margin. Chosen for contrast in print and for colour-blind
  // readers (the process/seam/air paths also differ in width and dash).
  static const std::string kStyle = R"(
:root { --ink: #1f2a33; --muted: #5b6873; --rule: #d5dbe0; --card: #ffffff; --page: #eef1f4;
  --teal: #0f6f6a; --orange: #c9501f; --steel: #24527a; --alert: #b3261e; --sand: #f6e3ad; --rose: #f1c4bd; }
* { box-sizing: border-box; }
body { margin: 0; background: var(--page); color: var(--ink);
  font: 13px/1.45 system-ui, "Segoe UI", "DejaVu Sans", sans-serif; }
header.masthead { background: var(--ink); color: #f4f6f8; padding: 18px 28px 16px; }
header.masthead h1 { margin: 0; font-size: 22px; font-weight: 600; letter-spacing: 0.01em; }
header.masthead .job { color: #9fd6cf; }
header.masthead dl { display: flex; flex-wrap: wrap; gap: 4px 26px; margin: 10px 0 0; }
header.masthead dt { color: #9aa7b2; font-size: 11px; text-transform: uppercase; letter-spacing: 0.06em; }
header.masthead dd { margin: 0; font-variant-numeric: tabular-nums; }
main { max-width: 1360px; margin: 0 auto; padding: 16px 20px 40px; }
section.card { background: var(--card); border: 1px solid var(--rule); border-radius: 6px;
  padding: 12px 16px 14px; margin: 0 0 14px; }
h2 { font-size: 16px; margin: 0 0 8px; font-weight: 600; }
h2 + h2, table + h2 { margin-top: 14px; }
h3 { font-size: 13px; margin: 12px 0 6px; color: var(--muted); font-weight: 600;
  text-transform: uppercase; letter-spacing: 0.05em; }
.caution { background: #fff6e5; border: 1px solid #e7c27d; border-left: 6px solid #c77700;
  border-radius: 6px; padding: 10px 16px; margin: 0 0 14px; }
.caution strong { color: #7a4600; }
.caution p { margin: 4px 0; }
.note { color: var(--muted); font-style: italic; margin: 6px 0 0; }
table { border-collapse: collapse; font-variant-numeric: tabular-nums; }
th, td { padding: 3px 8px; border-bottom: 1px solid var(--rule); text-align: right; white-space: nowrap; }
th { background: #f3f5f7; font-weight: 600; color: var(--muted); font-size: 12px; }
td.text, th.text { text-align: left; }
tr.event td { color: var(--muted); background: #fafbfc; }
tr.warned td:first-child { border-left: 3px solid var(--alert); }
ul.warnings { margin: 0; padding: 0; list-style: none; }
ul.warnings li { margin: 2px 0; padding-left: 34px; text-indent: -34px; }
ul.warnings .tag { display: inline-block; min-width: 34px; text-indent: 0; font-weight: 700; color: var(--alert); }
.ok { color: var(--teal); }
.views { display: flex; flex-wrap: wrap; gap: 10px; justify-content: space-between; }
.chart-grid { display: flex; flex-wrap: wrap; gap: 6px 10px; }
figure { margin: 0; }
figure.chart { width: 420px; }
figure.chart-empty { height: 120px; border: 1px dashed var(--rule); border-radius: 4px; padding: 8px 12px; color: var(--muted); }
.empty-title { font-weight: 600; color: var(--ink); }
.chart-row { display: flex; align-items: flex-start; }
figcaption { color: var(--muted); font-size: 11.5px; padding-left: 62px; font-variant-numeric: tabular-nums; }
.legend { display: flex; flex-wrap: wrap; gap: 4px 18px; color: var(--muted); font-size: 12px; margin: 4px 0 0; }
.swatch { display: inline-block; width: 22px; height: 10px; vertical-align: middle; margin-right: 5px; border-radius: 2px; }
.sw-process { background: var(--orange); } .sw-seam { background: var(--teal); }
.sw-air { background: repeating-linear-gradient(90deg, #8a96a0 0 5px, transparent 5px 8px); }
.sw-body-0 { background: #d7dde3; } .sw-body-1 { background: #e9dcc2; }
.sw-body-2 { background: #d3e4d6; } .sw-body-3 { background: #e7e2ef; }
.sw-strip { background: var(--orange); height: 4px; }
.sw-limit { background: var(--rose); } .sw-near { background: var(--sand); }
.sw-warning { border-left: 2px dashed var(--alert); width: 2px; border-radius: 0; }
details summary { cursor: pointer; font-weight: 600; font-size: 15px; }
.scroll { overflow-x: auto; margin-top: 8px; }
code, .hash { font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-size: 12px; }
svg text { font-family: system-ui, "Segoe UI", "DejaVu Sans", sans-serif; fill: var(--ink); }
.plot-area { fill: #fbfcfd; }
.plot-frame { fill: none; stroke: #9aa7b2; stroke-width: 1; }
line.grid { stroke: #e3e8ec; stroke-width: 1; }
text.tick { font-size: 10.5px; fill: var(--muted); }
text.plot-title { font-size: 12.5px; font-weight: 600; }
text.axis-label { font-size: 10.5px; fill: var(--muted); }
.strip-process { fill: var(--orange); }
.band-limit { fill: var(--rose); }
.band-near { fill: var(--sand); }
.line-joint { fill: none; stroke: var(--steel); stroke-width: 1.6; stroke-linejoin: round; }
.dot-joint { fill: var(--steel); }
.line-commanded { fill: none; stroke: var(--steel); stroke-width: 2.4; }
.line-chord { fill: none; stroke: #e08a5f; stroke-width: 1.2; }
.line-clearance { fill: none; stroke: #2d7d46; stroke-width: 2.2; }
.line-singularity { fill: none; stroke: #6a4c93; stroke-width: 1.6; }
.dot-singularity { fill: #6a4c93; }
.warning-mark { stroke: var(--alert); stroke-width: 1.3; stroke-dasharray: 4 3; }
text.warning-mark-label { font-size: 10px; font-weight: 700; fill: var(--alert); }
.gauge-range { fill: #e6eaee; stroke: #9aa7b2; stroke-width: 0.6; }
.gauge-used { fill: var(--steel); opacity: 0.85; }
.body { stroke-width: 0.5; stroke-linejoin: round; }
.body-0 { fill: #d7dde3; stroke: #a9b4be; } .body-1 { fill: #e9dcc2; stroke: #c2ab82; }
.body-2 { fill: #d3e4d6; stroke: #97b89e; } .body-3 { fill: #e7e2ef; stroke: #bfb5d3; }
text.body-label { font-size: 10px; fill: #46535e; }
.path-process { fill: none; stroke: var(--orange); stroke-width: 3.2; stroke-linecap: round; }
.path-seam { fill: none; stroke: var(--teal); stroke-width: 1.8; stroke-linecap: round; }
.path-air { fill: none; stroke: #8a96a0; stroke-width: 1.2; stroke-dasharray: 5 3; }
.path-start { fill: #ffffff; stroke: var(--ink); stroke-width: 1.5; }
.seam-dot { fill: var(--teal); }
text.seam-label { font-size: 11.5px; font-weight: 700; fill: var(--teal); paint-order: stroke; stroke: #ffffff; stroke-width: 3px; }
text.seam-label-left { text-anchor: end; }
text.path-label, text.base-label { font-size: 10.5px; fill: var(--muted); }
.base-mark { fill: #ffffff; stroke: var(--ink); stroke-width: 2; }
.base-centre { fill: var(--ink); }
footer { color: var(--muted); font-size: 11.5px; text-align: center; padding: 8px 0 24px; }
@media print { body { background: #ffffff; } section.card { break-inside: avoid; border-color: #bbbbbb; } }
)";
  return kStyle;
}

}  // namespace tw::postproc
