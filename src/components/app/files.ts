/** Small browser helpers for files and dates shown in lists. */

/** Save a fetch answer as a download with the given name (browser only). */
export async function downloadResponse(response: Response, fileName: string): Promise<void> {
  downloadBlob(await response.blob(), fileName);
}

/** Save a blob or data URL as a download. */
export function downloadBlob(blob: Blob | string, fileName: string): void {
  const url = typeof blob === 'string' ? blob : URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName.replace(/[\\/:*?"<>|]+/g, '_');
  document.body.appendChild(link);
  link.click();
  link.remove();
  if (typeof blob !== 'string') setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** A timestamp as the user's locale writes it, e.g. "2 Dec 2025, 14:05". */
export function formatWhen(iso: string): string {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  return date.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}
