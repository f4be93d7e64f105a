/** A session's times in this browser's zone, with the zone named. */
export function formatWhen(iso: string): string {
  return new Intl.DateTimeFormat('en-GB', {
    day: 'numeric',
    month: 'short',
    hour: '2-digit',
    minute: '2-digit',
    timeZoneName: 'short',
  }).format(new Date(iso));
}

/** "Chrome on Linux" from a user-agent string; the string itself when it says nothing familiar. */
export function browserOf(userAgent: string | null): string {
  if (!userAgent) return 'unknown browser';
  const browser = [
    ['Edg/', 'Edge'],
    ['Firefox/', 'Firefox'],
    ['Chrome/', 'Chrome'],
    ['Safari/', 'Safari'],
  ].find(([mark]) => userAgent.includes(mark!))?.[1];
  const system = [
    ['Windows', 'Windows'],
    ['Android', 'Android'],
    ['iPhone', 'iOS'],
    ['Mac OS', 'macOS'],
    ['Linux', 'Linux'],
  ].find(([mark]) => userAgent.includes(mark!))?.[1];
  if (!browser) return userAgent.slice(0, 60);
  return system ? `${browser} on ${system}` : browser;
}
