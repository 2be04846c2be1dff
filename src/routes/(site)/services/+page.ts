// A content page: prerendered to static HTML and shipped with no JavaScript.
export const prerender = true;
export const csr = false;
