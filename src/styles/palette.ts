/**
 * Nestwright's own palette: woodland tones (moss, bark, eggshell, lichen) with warm signal colours.
 * The one place colours are named; the Naive UI theme and the CSS variables are derived from it.
 */
export const PALETTE = {
  /** Primary: deep moss green. */
  moss: '#3f6a3a',
  mossLight: '#527f4b',
  mossDark: '#2f5230',
  /** Secondary: weathered bark brown. */
  bark: '#6a4a32',
  barkLight: '#8a6649',
  /** Page background: eggshell. */
  eggshell: '#f5f0e4',
  /** Cards and raised surfaces. */
  paper: '#fcfaf4',
  /** Soft lichen green for quiet fills. */
  lichen: '#dfe5cc',
  /** Text. */
  ink: '#25231e',
  inkSoft: '#4e4a40',
  inkMuted: '#6c675b',
  /** Lines and borders. */
  line: '#ddd5c3',
  lineSoft: '#ebe4d4',
  /** Signals. */
  /** Warning text and icons; dark enough for 4.5:1 on eggshell. */
  ochre: '#8c5f14',
  rust: '#a63d2a',
  slate: '#3d6475',
  /** Darker rust for text on a rust tint. */
  rustDark: '#862f20',
  /** Amber: accents of cautions (left rules, warm bars). */
  amber: '#b07a1e',
  /** Soft tints behind errors and cautions. */
  rustTint: '#fbefe9',
  ochreTint: '#fbf3e2',
  /** Quiet sand fills: chips, empty photo frames, tracks of bars. */
  sand: '#eee8da',
  sandLight: '#f6f2e8',
  /** Table headers and quiet bars. */
  parchment: '#f1ecdf',
  /** Background of the 3D stage and of preview cards. */
  stage: '#f6f3ec',
  /** Input fields and raised panels inside cards. */
  field: '#fffdf8',
  /** Pure white for cards that sit on paper. */
  white: '#ffffff',
  /** Stronger lines (the build plate's grid, glyph outlines). */
  lineStrong: '#c9c0ad',
  /** Dark olive at the end of the sign-in screen's gradient. */
  olive: '#4a5a33',
  /** The build plate as the viewer draws it (and the stage's legend shows it). */
  plate: '#e9e4d8',
  plateEdge: '#7b6f58',
  plateVolume: '#b9ae98',
  /** The build-direction arrow on the plate. */
  buildArrow: '#3f6f5a',
  /** Lights of the 3D stage: warm sky, earthy ground bounce, white key light, cool rim light. */
  lightSky: '#fffaf0',
  lightGround: '#8a7f6a',
  lightKey: '#ffffff',
  lightRim: '#dfe8ff',
} as const;

/** A palette colour's name. */
export type PaletteName = keyof typeof PALETTE;

/**
 * A palette colour as the number three.js takes (`0x3f6a3a`).
 * @param name - the palette colour
 */
export function paletteNumber(name: PaletteName): number {
  return Number.parseInt(PALETTE[name].slice(1), 16);
}

/**
 * The CSS variable of a palette colour (`mossDark` → `--nw-moss-dark`).
 * @param name - the palette colour
 */
export function paletteVariable(name: PaletteName): string {
  return `--nw-${name.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)}`;
}

/**
 * Sets every palette colour as a CSS variable on the document root, so stylesheets use `var(--nw-…)` and the palette
 * stays the one place colours are named.
 * @param root - the element to set them on (the document's root element)
 */
export function applyPaletteVariables(root: { style: { setProperty(name: string, value: string): void } }): void {
  for (const name of Object.keys(PALETTE) as PaletteName[])
    root.style.setProperty(paletteVariable(name), PALETTE[name]);
}

/** Font stacks: the families are shipped from @fontsource (imported in main.ts). */
export const FONTS = {
  heading: "'Fraunces', Georgia, 'Times New Roman', serif",
  text: "'Source Sans 3', system-ui, -apple-system, 'Segoe UI', sans-serif",
  figures: "'JetBrains Mono', ui-monospace, Menlo, Consolas, monospace",
} as const;
