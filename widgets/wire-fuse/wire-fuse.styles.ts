/** The wire-and-fuse sizer's own styles. */
export const wireFuseCss = `
.size{font-size:1.4em;font-weight:800}
`;
