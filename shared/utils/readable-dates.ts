// A calendar date (YYYY-MM-DD) as people read it in reports, e-mails and printouts, never shifted by
// a time zone: "Tuesday, November 24, 2026", and in a subject line or a heading "Tue, Nov 24, 2026".
const atNoon = (date: string) => new Date(`${date}T12:00:00Z`)

export function readableDate(date: string, locale = 'en-US'): string {
  return new Intl.DateTimeFormat(locale, { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' }).format(atNoon(date))
}

export function shortDate(date: string, locale = 'en-US'): string {
  return new Intl.DateTimeFormat(locale, { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' }).format(atNoon(date))
}
