// Markdown to HTML for the release report. markdown-it with raw HTML off escapes every `<` of the
// text (design names and review comments are user input) and refuses javascript:/data: links;
// it loads lazily, only on the release page.

/**
 * Renders Markdown as safe HTML: no raw HTML passes, links are checked by markdown-it's validateLink.
 * @param text - Markdown (CommonMark with GitHub tables).
 * @returns the HTML.
 */
export async function renderMarkdown(text: string): Promise<string> {
  const { default: MarkdownIt } = await import('markdown-it');
  const md = new MarkdownIt({ html: false, linkify: false, typographer: false });
  return md.render(text);
}
