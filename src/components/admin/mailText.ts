/**
 * A mail's plain text as pieces to show: text, and the links in it (http and https only). A link
 * to this very site becomes an in-app path, so following it stays in the app; any other is an
 * outside link. The text is never turned into HTML, so a subject or name cannot inject markup.
 */
export type MailPiece = { kind: 'text'; text: string } | { kind: 'link'; href: string; inApp: string | null };

const URL_PATTERN = /https?:\/\/[^\s<>"]+/g;

export function mailPieces(text: string, origin: string): MailPiece[] {
  const pieces: MailPiece[] = [];
  let last = 0;
  for (const match of text.matchAll(URL_PATTERN)) {
    const start = match.index ?? 0;
    // A sentence's full stop or closing bracket after a link is not part of it.
    const href = match[0].replace(/[.,;:)]+$/, '');
    if (start > last) pieces.push({ kind: 'text', text: text.slice(last, start) });
    let inApp: string | null = null;
    try {
      const url = new URL(href);
      if (url.origin === origin) inApp = `${url.pathname}${url.search}${url.hash}`;
    } catch {
      // not a URL after all: shown as a link the browser will judge
    }
    pieces.push({ kind: 'link', href, inApp });
    last = start + href.length;
  }
  if (last < text.length) pieces.push({ kind: 'text', text: text.slice(last) });
  return pieces;
}
