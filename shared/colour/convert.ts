import Color from 'colorjs.io';

/** CIELAB under D65 (2° observer), the only Lab this app stores. */
export type Lab = { L: number; a: number; b: number };
export type Rgb = { r: number; g: number; b: number };
export type Xyz = [number, number, number];

/** D65 white (Y = 1) as colorjs.io defines it (x = 0.3127, y = 0.3290). */
export const D65_WHITE: Xyz = [...(Color.spaces['lab-d65'].white as [number, number, number])] as Xyz;

const toLab = (c: Color): Lab => {
  const [L, a, b] = c.to('lab-d65').coords as [number, number, number];
  return { L, a, b };
};

/** 8-bit sRGB (0–255 per channel) to CIELAB D65. */
export function srgbToLab({ r, g, b }: Rgb): Lab {
  return toLab(new Color('srgb', [r / 255, g / 255, b / 255]));
}

export function hexToLab(hex: string): Lab {
  if (!/^#?[0-9a-f]{6}$/i.test(hex)) throw new Error(`Not a #rrggbb colour: ${hex}`);
  return toLab(new Color(hex.startsWith('#') ? hex : `#${hex}`));
}

/** CIELAB D65 to 8-bit sRGB, clipped into the sRGB gamut per channel. */
export function labToSrgb({ L, a, b }: Lab): Rgb {
  const [r, g, bl] = new Color('lab-d65', [L, a, b]).to('srgb').coords as [number, number, number];
  const q = (v: number) => Math.round(Math.min(1, Math.max(0, v)) * 255);
  return { r: q(r), g: q(g), b: q(bl) };
}

export function labToHex(lab: Lab): string {
  const { r, g, b } = labToSrgb(lab);
  return `#${[r, g, b].map((v) => v.toString(16).padStart(2, '0')).join('')}`;
}

/** Linear-light sRGB (0–1) to XYZ D65 (Y = 1 for white). */
export function linearRgbToXyz(rgb: [number, number, number]): Xyz {
  return new Color('srgb-linear', rgb).to('xyz-d65').coords as Xyz;
}

export function xyzToLinearRgb(xyz: Xyz): [number, number, number] {
  return new Color('xyz-d65', xyz).to('srgb-linear').coords as [number, number, number];
}

export function xyzToLab(xyz: Xyz): Lab {
  return toLab(new Color('xyz-d65', xyz));
}

/** Chroma C*ab and hue angle h_ab in degrees (0–360). */
export function labToLch({ L, a, b }: Lab) {
  const C = Math.hypot(a, b);
  const h = (Math.atan2(b, a) * 180) / Math.PI;
  return { L, C, h: h < 0 ? h + 360 : h };
}
