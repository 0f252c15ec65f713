/**
 * The words of an element as a reader meets them: separate text nodes joined by one space
 * (jsdom has no layout, so `innerText` cannot do this in specs).
 */
export function textOf(element: Element | null | undefined): string {
  if (!element) return '';
  const walker = element.ownerDocument.createTreeWalker(element, NodeFilter.SHOW_TEXT);
  const words: string[] = [];
  for (let node = walker.nextNode(); node; node = walker.nextNode()) {
    const content = node.textContent?.replace(/\s+/g, ' ').trim();
    if (content) words.push(content);
  }
  return words.join(' ');
}
