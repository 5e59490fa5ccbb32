import MarkdownIt from 'markdown-it';
import sanitizeHtml from 'sanitize-html';

// A small Markdown subset: paragraphs, emphasis, inline and block code, quotes,
// lists and links. Raw HTML is off in the parser, and the output is sanitised
// again, so nothing a person types can become script, style, a frame or an image
// that calls a third party (images are off altogether).
const markdown = new MarkdownIt('zero', { html: false, linkify: true, breaks: true })
  .enable(['paragraph', 'newline', 'emphasis', 'backticks', 'code', 'fence', 'blockquote', 'list', 'link', 'linkify', 'escape', 'entity'])
  .disable(['image', 'html_inline', 'html_block'], true);

// markdown-it's validateLink already refuses javascript:, vbscript: and most data:
// URLs; the sanitiser's scheme list below is the second lock on the same door.
const SANITIZE: sanitizeHtml.IOptions = {
  allowedTags: ['p', 'br', 'strong', 'em', 'code', 'pre', 'blockquote', 'ul', 'ol', 'li', 'a'],
  allowedAttributes: { a: ['href', 'rel'], ol: ['start'] },
  allowedSchemes: ['http', 'https', 'mailto'],
  allowProtocolRelative: false,
  disallowedTagsMode: 'escape',
  transformTags: {
    a: (tagName, attribs) => ({ tagName, attribs: { ...attribs, rel: 'nofollow ugc noopener' } }),
  },
};

/** Markdown source → HTML that is safe to put into the page as it is. */
export function renderPostHtml(source: string): string {
  return sanitizeHtml(markdown.render(source), SANITIZE).trim();
}
