// How MariaDB's utf8mb4_unicode_ci collation (every Tamp table's) compares text: without regard to
// letter case or accents, so "Gravel", "gravel" and "Grável" are one estimate line to its unique key.
// Both sides fold names this way before they compare them, so a clash is found as a clear message
// rather than as a failed insert. (Rare foldings of the collation, such as ß = ss, are still caught
// by the key itself.)

/** The form of `text` that two names share when the database would call them the same. */
export function matchKey(text: string): string {
  return text.normalize('NFD').replace(/\p{M}/gu, '').toLowerCase().trim()
}
