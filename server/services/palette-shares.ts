/**
 * Shares after a background flag changes. Convention: a colour counted in the palette
 * has its share of the counted (non-background) area, so those shares sum to 1; a
 * background colour keeps its share of the whole analysed area. Converting everything
 * to whole-area fractions first makes the toggle exact and reversible.
 */
export function reshare<T extends { id: number; share: number; background: boolean }>(
  colours: T[],
  toggledId: number,
  background: boolean,
) {
  const bgArea = colours.filter((c) => c.background).reduce((s, c) => s + c.share, 0);
  const counted = Math.max(0, 1 - bgArea);
  const area = new Map(colours.map((c) => [c.id, c.background ? c.share : c.share * counted]));
  const flags = new Map(colours.map((c) => [c.id, c.id === toggledId ? background : c.background]));
  const countedAfter = colours.filter((c) => !flags.get(c.id)).reduce((s, c) => s + area.get(c.id)!, 0);
  return colours.map((c) => {
    const a = area.get(c.id)!;
    const bg = flags.get(c.id)!;
    return { id: c.id, background: bg, share: bg ? a : countedAfter > 0 ? a / countedAfter : 0 };
  });
}
