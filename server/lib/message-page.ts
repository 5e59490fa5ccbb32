const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/**
 * A small page of our own for answers a browser navigates to outside the client
 * (a sign-in gone wrong, an unsubscribe link, a rate limit): what happened, and a way on.
 */
export function messagePage(
  title: string,
  message: string,
  link: { href: string; label: string } = { href: '/', label: 'Back to Crosswatt' },
): string {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)} · Crosswatt</title><link rel="icon" href="data:,">
<style>
  body { margin: 0; padding: 0 1rem; font-family: "Work Sans", system-ui, sans-serif; background: #f8f6f1; color: #1d2428; }
  main { max-width: 34rem; margin: 12vh auto; padding: 2rem; background: #fff; border: 1px solid #ddd6c8; border-radius: 0.875rem; }
  h1 { font-size: 1.5rem; margin: 0 0 0.75rem; }
  p { color: #4a5358; line-height: 1.6; }
  a { display: inline-block; margin-top: 1rem; padding: 0.5rem 1.25rem; border-radius: 999px; background: #1d5557; color: #f8f6f1; text-decoration: none; }
  a:focus-visible { outline: 3px solid #eb9a6c; outline-offset: 2px; }
</style></head>
<body><main><h1>${escapeHtml(title)}</h1><p>${escapeHtml(message)}</p>
<a href="${escapeHtml(link.href)}">${escapeHtml(link.label)}</a></main></body></html>`;
}
