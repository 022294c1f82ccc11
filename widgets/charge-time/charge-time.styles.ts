/** The charge-time estimator's own styles. */
export const chargeTimeCss = `
.total{font-size:1.4em;font-weight:800}
.chart{background:var(--_surface);border-radius:.5rem;padding:.5rem}
.chart polyline{fill:none;stroke:var(--_accent);stroke-width:2.5}
.chart line{stroke:var(--_border);stroke-width:1}
.chart text{fill:var(--_muted);font-size:11px}
`;
