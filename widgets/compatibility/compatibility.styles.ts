/** The compatibility checker's own styles (the rest are the shared base styles). */
export const compatibilityCss = `
.method h3{display:flex;flex-wrap:wrap;gap:.5rem;align-items:center;justify-content:space-between}
.method ul{font-size:.92em}
`;
