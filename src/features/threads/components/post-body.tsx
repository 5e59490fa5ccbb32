// The HTML was rendered from a small Markdown subset and sanitised on the server
// (no raw HTML, no images, links nofollow), so it can go into the page as it is.
export function PostBody({ html }: { html: string }) {
  return (
    <div
      className="space-y-2 break-words text-body text-ink [&_a]:font-medium [&_a]:text-fjord-700 [&_a]:underline [&_a]:underline-offset-2 [&_blockquote]:border-l-4 [&_blockquote]:border-paper-line [&_blockquote]:pl-3 [&_blockquote]:text-ink-soft [&_code]:rounded [&_code]:bg-paper-deep [&_code]:px-1 [&_code]:text-[0.9em] [&_ol]:list-decimal [&_ol]:pl-6 [&_pre]:overflow-x-auto [&_pre]:rounded-lg [&_pre]:bg-paper-deep [&_pre]:p-3 [&_ul]:list-disc [&_ul]:pl-6"
      // biome-ignore lint/security/noDangerouslySetInnerHtml: rendered and sanitised on the server (see above)
      dangerouslySetInnerHTML={{ __html: html }}
    />
  );
}
