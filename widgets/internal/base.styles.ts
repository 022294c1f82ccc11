/**
 * Styles every widget shares, adopted into its shadow root as a constructed stylesheet (not a <style>
 * element, which a strict `style-src` would block). Themed by CSS custom properties (`--ohmstead-*`, see
 * theme.ts) and styled from outside through parts (`::part(submit)` …). Single column from 320 px; fields
 * flow into columns where there is room. Controls are at least 40 px tall (WCAG 2.5.8 asks 24) and the
 * focus ring is 3 px.
 */
import { paletteCss, palettes } from './theme.ts';

export const baseCss = `
:host{${paletteCss(palettes.light)}display:block;container-type:inline-size;color:var(--_fg);font-family:var(--ohmstead-font,system-ui,-apple-system,"Segoe UI",Roboto,sans-serif);font-size:var(--ohmstead-font-size,1rem);line-height:1.45;max-width:var(--ohmstead-max-width,44rem)}
:host([theme=dark]){${paletteCss(palettes.dark)}}
@media (prefers-color-scheme:dark){:host([theme=auto]){${paletteCss(palettes.dark)}}}
:host([hidden]),[hidden]{display:none!important}
*{box-sizing:border-box}
.card{background:var(--_bg);border:1px solid var(--_border);border-radius:var(--ohmstead-radius,.75rem);padding:clamp(.75rem,4cqi,1.25rem)}
h2{font-size:1.15em;margin:0 0 .25rem}
p{margin:.25rem 0}
.sub{color:var(--_muted);margin:0 0 .75rem;font-size:.92em}
form{display:grid;gap:.75rem}
fieldset{border:1px solid var(--_border);border-radius:.5rem;margin:0;padding:.5rem .75rem .75rem;min-width:0}
legend{font-weight:600;padding:0 .25rem}
.grid{display:grid;gap:.75rem;grid-template-columns:repeat(auto-fit,minmax(min(100%,9.5rem),1fr))}
.field{display:flex;flex-direction:column;gap:.2rem;min-width:0}
label{font-weight:600;font-size:.92em}
.hint{color:var(--_muted);font-size:.85em}
input,select,button{font:inherit;color:inherit}
input,select{min-height:2.5rem;width:100%;background:var(--_bg);border:1px solid var(--_border);border-radius:.4rem;padding:.4rem .55rem}
input[type=checkbox]{width:1.25rem;min-height:1.25rem;height:1.25rem;accent-color:var(--_accent)}
.check{display:flex;align-items:center;gap:.5rem;min-height:2.5rem}
.check label{font-weight:400}
[aria-invalid=true]{border-color:var(--_danger);border-width:2px}
.field-error{color:var(--_danger);font-size:.88em;font-weight:600;margin:0}
:focus-visible{outline:3px solid var(--_focus);outline-offset:2px}
button{min-height:2.5rem;border-radius:.4rem;padding:.45rem 1rem;cursor:pointer;border:1px solid var(--_accent);background:var(--_bg);color:var(--_accent);font-weight:600}
button.primary{background:var(--_accent);color:var(--_on-accent)}
button[disabled]{opacity:.6;cursor:progress}
.actions{display:flex;flex-wrap:wrap;gap:.5rem;align-items:center}
.status{color:var(--_muted);font-size:.9em;min-height:1.2em}
.alert{border:2px solid var(--_danger);color:var(--_danger);border-radius:.5rem;padding:.5rem .75rem;font-weight:600}
.alert:empty{display:none}
.result{margin-top:1rem;display:grid;gap:.75rem}
.result:empty{display:none}
.verdict{display:inline-block;border-radius:999px;padding:.15rem .7rem;font-weight:700;color:var(--_bg)}
.verdict.compatible{background:var(--_ok)}.verdict.limited{background:var(--_warn)}.verdict.incompatible{background:var(--_danger)}
.figures{display:grid;gap:.5rem;grid-template-columns:repeat(auto-fit,minmax(min(100%,8.5rem),1fr));margin:0}
.figures div{background:var(--_surface);border-radius:.5rem;padding:.5rem .6rem}
dt{color:var(--_muted);font-size:.82em}
dd{margin:0;font-weight:700;font-variant-numeric:tabular-nums}
ul{margin:.25rem 0;padding-left:1.2rem}
.checks li.danger{color:var(--_danger);font-weight:600}.checks li.warning{color:var(--_warn)}
.cautions{border-left:4px solid var(--_warn);background:var(--_surface);padding:.5rem .75rem;border-radius:.25rem;font-size:.9em}
.cautions h3,.method h3{font-size:1em;margin:0 0 .25rem}
.method{border:1px solid var(--_border);border-radius:.5rem;padding:.6rem .75rem}
details{font-size:.88em;color:var(--_muted)}
summary{cursor:pointer;min-height:1.5rem}
.table-wrap{overflow-x:auto}
table{border-collapse:collapse;width:100%;font-size:.9em}
th,td{text-align:left;padding:.35rem .5rem;border-bottom:1px solid var(--_border);vertical-align:top}
td.num,th.num{text-align:right;font-variant-numeric:tabular-nums}
.visually-hidden{position:absolute;width:1px;height:1px;overflow:hidden;clip:rect(0 0 0 0);white-space:nowrap}
.brand{color:var(--_muted);font-size:.78em;margin-top:.75rem}
svg{max-width:100%;height:auto}
`;

/** One constructed stylesheet per CSS text, shared by every instance on the page. */
const sheets = new Map<string, CSSStyleSheet>();
export function sheetFor(css: string): CSSStyleSheet {
  let sheet = sheets.get(css);
  if (!sheet) {
    sheet = new CSSStyleSheet();
    sheet.replaceSync(css);
    sheets.set(css, sheet);
  }
  return sheet;
}
