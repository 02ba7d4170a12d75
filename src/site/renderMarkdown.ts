import MarkdownIt from "markdown-it";
import sanitizeHtml from "sanitize-html";

const md = new MarkdownIt({ html: false, linkify: false, typographer: false });

/**
 * A scenario description: Markdown through markdown-it with raw HTML disabled, then sanitize-html with a small
 * allowlist (no scripts, no event handlers, links only to http(s), mailto or relative targets).
 */
export function renderMarkdown(text: string | null): string {
  if (!text) return "";
  return sanitizeHtml(md.render(text), {
    allowedTags: [
      "p",
      "em",
      "strong",
      "code",
      "pre",
      "ul",
      "ol",
      "li",
      "a",
      "blockquote",
      "h3",
      "h4",
      "br",
      "hr",
      "table",
      "thead",
      "tbody",
      "tr",
      "th",
      "td",
    ],
    allowedAttributes: { a: ["href", "title"] },
    allowedSchemes: ["http", "https", "mailto"],
    allowProtocolRelative: false,
    transformTags: { a: sanitizeHtml.simpleTransform("a", { rel: "noopener noreferrer" }) },
  });
}
