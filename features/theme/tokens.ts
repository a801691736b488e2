// Causeway's one theme module: palette, type, spacing, breakpoints. No colour literal lives elsewhere.
export const palette = {
  light: {
    ink: '#1E272C',
    paper: '#F7F4EC',
    card: '#FFFFFF',
    tide: '#2C6E72',
    tideInk: '#FFFFFF',
    sand: '#E6DCC6',
    amber: '#8A5A00', // darkened from the design's #B87503 so caution text passes WCAG AA on paper
    amberFill: '#FBF0D9',
    brick: '#A8392A',
    brickFill: '#F8E4E0',
    moss: '#4C7438',
    mossFill: '#E5EEDD',
    slate: '#5B676E', // design's #66737A nudged darker: secondary text at AA on paper and card
    line: '#D9D2C2',
    focus: '#2C6E72',
    overlay: 'rgba(30,39,44,0.45)',
  },
  dark: {
    ink: '#E8E4DA',
    paper: '#151B1E',
    card: '#1F272B',
    tide: '#5FA8AC',
    tideInk: '#0E1416',
    sand: '#3A362E',
    amber: '#E0A43A',
    amberFill: '#3A2F1A',
    brick: '#E07462',
    brickFill: '#3D2420',
    moss: '#8DB877',
    mossFill: '#25331F',
    slate: '#97A3A9',
    line: '#344047',
    focus: '#8CCACD',
    overlay: 'rgba(0,0,0,0.6)',
  },
} as const;

export type Palette = { [K in keyof typeof palette.light]: string };
export type ColourName = keyof Palette;

export const fonts = {
  serif: 'SourceSerif4_400Regular',
  serifItalic: 'SourceSerif4_400Regular_Italic',
  serifSemiBold: 'SourceSerif4_600SemiBold',
  serifBold: 'SourceSerif4_700Bold',
  // The platform's own sans for controls and tables; a monospace for codes and readings.
  sans: 'system-ui, -apple-system, "Segoe UI", Roboto, "Noto Sans", "Helvetica Neue", Arial, sans-serif',
  mono: 'ui-monospace, "SFMono-Regular", "DejaVu Sans Mono", Menlo, Consolas, monospace',
} as const;

/** UI type scale in px; reading text is 16 px with a 1.5 line height on a phone. */
export const type = {
  caption: { fontSize: 13, lineHeight: 18 },
  small: { fontSize: 14, lineHeight: 20 },
  body: { fontSize: 16, lineHeight: 24 },
  lead: { fontSize: 18, lineHeight: 27 },
  title: { fontSize: 22, lineHeight: 28 },
  display: { fontSize: 28, lineHeight: 34 },
} as const;

export const space = { xxs: 2, xs: 4, sm: 8, md: 12, lg: 16, xl: 24, xxl: 32, xxxl: 48 } as const;
export const radius = { sm: 6, md: 10, lg: 14, pill: 999 } as const;

export const layout = {
  /** Side navigation from this width; below it the bottom tabs. */
  wideFrom: 1024,
  /** Two-column forms and side-by-side panes from this width. */
  tabletFrom: 768,
  /** About 72 characters of Source Serif at 16 px. */
  readingWidth: 720,
  contentMax: 1200,
  touchTarget: 44,
  sideNavWidth: 232,
} as const;
