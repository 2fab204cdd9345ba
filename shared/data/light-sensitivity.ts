/**
 * Light-sensitivity categories and their limits.
 *
 * Source: CIE 157:2004 "Control of damage to museum objects by optical radiation", its table of responsivity
 * categories (ISO blue wool references) with a limiting illuminance and a limiting annual exposure. The figures
 * below are RECALLED FROM MEMORY, not read in a stored copy of CIE 157: check them against the standard before
 * relying on them. Check values: tests/reference/light-limits.json.
 */
export const LIGHT_CATEGORIES = ['irresponsive', 'low', 'medium', 'high'] as const;
export type LightCategory = (typeof LIGHT_CATEGORIES)[number];

export type LightLimit = {
  category: LightCategory;
  label: string;
  /** The ISO blue wool references the category spans. */
  blueWool: string;
  /** Limiting illuminance, lux (null: no limit). */
  maxLux: number | null;
  /** Limiting annual exposure, lux·hours a year (null: no limit). */
  annualLuxHours: number | null;
};

export const LIGHT_LIMITS_SOURCE =
  'CIE 157:2004, responsivity categories and limiting annual exposure (values recalled from memory)';

export const LIGHT_LIMITS: Record<LightCategory, LightLimit> = {
  irresponsive: {
    category: 'irresponsive',
    label: 'irresponsive',
    blueWool: 'none',
    maxLux: null,
    annualLuxHours: null,
  },
  low: {
    category: 'low',
    label: 'low responsivity',
    blueWool: 'ISO 7 and above',
    maxLux: 200,
    annualLuxHours: 600_000,
  },
  medium: {
    category: 'medium',
    label: 'medium responsivity',
    blueWool: 'ISO 4–6',
    maxLux: 50,
    annualLuxHours: 150_000,
  },
  high: { category: 'high', label: 'high responsivity', blueWool: 'ISO 1–3', maxLux: 50, annualLuxHours: 15_000 },
};

/**
 * The category of each dyestuff as usually met on textiles (mordanted, medium depth). Common practice, recalled
 * from memory (no published table is followed here): yellow flavonoid dyes, safflower, turmeric and the redwoods
 * fade fast (blue wool 1–3); madder, cochineal, lac, kermes, logwood and indigo sit at about blue wool 4–6. A pale
 * shade fades faster than a deep one, so a curator should set a piece's category by hand when known.
 */
export const DYESTUFF_CATEGORY: Record<string, LightCategory> = {
  madder: 'medium',
  cochineal: 'medium',
  lac: 'medium',
  kermes: 'medium',
  indigo: 'medium',
  woad: 'medium',
  logwood: 'medium',
  weld: 'high',
  'old fustic': 'high',
  quercitron: 'high',
  turmeric: 'high',
  safflower: 'high',
  'brazilwood / sappanwood': 'high',
  brazilwood: 'high',
  'Persian berries (buckthorn berries, Avignon berries)': 'high',
};
export const DYESTUFF_CATEGORY_SOURCE =
  'common practice, recalled from memory: typical blue-wool ranges of natural dyes on mordanted textiles';

/** UV above this many µW/lm is flagged (common practice, recalled from memory: the long-used 75 µW/lm guide). */
export const UV_MAX_MICROWATTS_PER_LUMEN = 75;
