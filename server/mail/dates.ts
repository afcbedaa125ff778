/**
 * Dates as people read them in an e-mail: "Saturday 12 December 2026, 23:59 UTC" rather than an
 * ISO timestamp. In the server's time zone (the process's `TZ`), named, so a reader elsewhere
 * still knows which moment is meant.
 */
export function mailDate(date: Date, timeZone?: string): string {
  const format = new Intl.DateTimeFormat('en-GB', { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric', hour: '2-digit', minute: '2-digit', timeZone, timeZoneName: 'short' });
  const parts = Object.fromEntries(format.formatToParts(date).map((p) => [p.type, p.value]));
  return `${parts.weekday} ${parts.day} ${parts.month} ${parts.year}, ${parts.hour}:${parts.minute} ${parts.timeZoneName}`;
}
