/**
 * The date of a run for report headers (`YYYY-MM-DD`, UTC): from `SOURCE_DATE_EPOCH` (seconds
 * since 1970, the reproducible-builds convention) when it is set to an integer, else today.
 *
 * @param env - The environment.
 * @returns The date.
 */
export function runDate(env: Readonly<Record<string, string | undefined>>): string {
  const epoch = env['SOURCE_DATE_EPOCH'];
  const ms = epoch !== undefined && /^\d+$/.test(epoch) ? Number(epoch) * 1000 : Date.now();
  return new Date(ms).toISOString().slice(0, 10);
}
