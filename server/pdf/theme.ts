/**
 * The certificate's look, in one place: Filmtrail's own design (a narrow deep-teal band on the
 * left edge, small-caps labels, light rules, A4 portrait). Sizes are PDF points (1/72 in).
 */

export const PAGE = {
  /** A4 portrait. */
  widthPt: 595.28,
  heightPt: 841.89,
  bandWidthPt: 18,
  contentLeftPt: 58,
  contentRightPt: 595.28 - 44,
  contentTopPt: 40,
  /** Content stops here; the footer lives below. */
  contentBottomPt: 841.89 - 62,
  footerTopPt: 841.89 - 46,
} as const

export const CONTENT_WIDTH_PT = PAGE.contentRightPt - PAGE.contentLeftPt

export const COLOUR = {
  band: '#1F5E63',
  accent: '#1F5E63',
  ink: '#1C2628',
  muted: '#5E6B6D',
  rule: '#D3DBDB',
  tint: '#EEF4F4',
  bandText: '#FFFFFF',
  /** Supersedes / nonconformance highlights: a warm tone that is not an alarm red. */
  notice: '#8A4B12',
} as const

export const SIZE = {
  issuerName: 12.5,
  address: 8.5,
  title: 21,
  kind: 9,
  heading: 8.5,
  label: 7.2,
  value: 9,
  table: 8.5,
  tableHead: 7.2,
  small: 7,
  footer: 6.8,
} as const

export const SPACE = {
  sectionGapPt: 14,
  headingGapPt: 7,
  rowGapPt: 8,
  columnGapPt: 14,
  labelGapPt: 1.5,
  cellPadXPt: 4,
  cellPadYPt: 4,
} as const

/** Small-caps labels use the font's own small capitals (Roboto has the OpenType smcp feature). */
export const SMALL_CAPS: PDFKit.Mixins.OpenTypeFeatures[] = ['smcp']
