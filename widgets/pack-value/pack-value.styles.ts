/** The pack-value comparison's own styles. */
export const packValueCss = `
.row{border:1px dashed var(--_border);border-radius:.5rem;padding:.5rem .75rem}
.row .actions{justify-content:flex-end}
.picks{display:grid;gap:.1rem}
tr.best td{font-weight:700}
`;
