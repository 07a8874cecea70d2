/** An http(s) address in mail text, as the local mailbox finds them. */
const LINK_PATTERN = /https?:\/\/[^\s<>"]+/g;
/** Punctuation that ends a sentence rather than the address. */
const TRAILING = /[.,;:!?)\]'’]+$/;
const LOCAL_HOSTS = new Set(['localhost', '127.0.0.1', '[::1]']);

export type TextPart = { kind: 'text'; text: string } | { kind: 'link'; href: string };

/** Splits mail text into plain runs and links, leaving sentence punctuation out of the links. */
export function splitLinks(text: string): TextPart[] {
  const parts: TextPart[] = [];
  let last = 0;
  for (const match of text.matchAll(LINK_PATTERN)) {
    const start = match.index;
    const href = match[0].replace(TRAILING, '');
    if (start > last) parts.push({ kind: 'text', text: text.slice(last, start) });
    parts.push({ kind: 'link', href });
    last = start + href.length;
  }
  if (last < text.length) parts.push({ kind: 'text', text: text.slice(last) });
  return parts;
}

/**
 * The in-app path of a link that points at this app, or null for one that leads elsewhere. A link
 * on this page's origin always counts. In a development build, so do links to any local port: the
 * server writes its own port into mail, while `npm run dev` serves the pages from Vite's.
 */
export function appPath(href: string, origin: string, developmentBuild: boolean): string | null {
  let url: URL;
  let page: URL;
  try {
    url = new URL(href);
    page = new URL(origin);
  } catch {
    return null;
  }
  const sameOrigin = url.origin === page.origin;
  const localInDevelopment = developmentBuild && LOCAL_HOSTS.has(url.hostname) && LOCAL_HOSTS.has(page.hostname);
  if (!sameOrigin && !localInDevelopment) return null;
  return `${url.pathname}${url.search}${url.hash}`;
}
