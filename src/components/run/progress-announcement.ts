/**
 * What a screen reader hears while a run or job is under way. The visible progress line changes a few times a
 * second; a live region holding it would be read out at every change and drown everything else. The live
 * region holds this instead, which changes at quarters only: "Started.", "25 % done.", "50 % done.", "75 % done.".
 * The end (done, failed, cancelled) is announced by the caller's own words.
 */
export function progressAnnouncement(fraction: number): string {
  const quarter = Number.isFinite(fraction) ? Math.max(0, Math.min(3, Math.floor(fraction * 4))) : 0;
  return quarter === 0 ? "Started." : `${quarter * 25} % done.`;
}
