/**
 * A PUT sent while the page is hidden or closing: `keepalive` lets the request outlive the page.
 * Browsers cap such bodies at 64 KB, so a bigger body is not sent (the caller's last autosave
 * stands); nothing waits for the answer, and a failure is silent because nobody is left to tell.
 */
export const KEEPALIVE_MAX_CHARS = 60_000;

export function putOnLeave(fetchImpl: typeof fetch, url: string, body: unknown): void {
  const text = JSON.stringify(body);
  if (text.length > KEEPALIVE_MAX_CHARS) return;
  void fetchImpl(url, {
    method: 'PUT',
    keepalive: true,
    credentials: 'same-origin',
    headers: { 'Content-Type': 'application/json', Accept: 'application/json' },
    body: text,
  }).catch(() => undefined);
}
