/**
 * Times from the API: ISO 8601 UTC ("2026-12-05T06:47:39.000Z"). The older SQLite form
 * "2026-12-05 06:47:39" (UTC, no zone) is read too. Shown in the browser's local time.
 */
export function parseServerTime(at: string): Date | null {
  const iso = /^\d{4}-\d\d-\d\d \d\d:\d\d:\d\d$/.test(at) ? `${at.replace(' ', 'T')}Z` : at;
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? null : d;
}

/** A server time in the reader's local time; the text as given when it is not a time. */
export function formatServerTime(at: string, opts: { seconds?: boolean } = {}): string {
  const d = parseServerTime(at);
  return d ? d.toLocaleString(undefined, { year: 'numeric', month: 'short', day: 'numeric', hour: '2-digit', minute: '2-digit', ...(opts.seconds ? { second: '2-digit' } : {}) }) : at;
}
