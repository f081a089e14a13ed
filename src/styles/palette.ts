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
} as const;

/** Font stacks: the families are shipped from @fontsource (imported in main.ts). */
export const FONTS = {
  heading: "'Fraunces', Georgia, 'Times New Roman', serif",
  text: "'Source Sans 3', system-ui, -apple-system, 'Segoe UI', sans-serif",
  figures: "'JetBrains Mono', ui-monospace, Menlo, Consolas, monospace",
} as const;
