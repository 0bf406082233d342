/** Number formats for Line health: one decimal for %, two for capability indices. */
export const pct = (v: number | null | undefined) =>
  v === null || v === undefined ? '—' : `${v.toFixed(1)} %`
export const index2 = (v: number | null | undefined) =>
  v === null || v === undefined ? '—' : v.toFixed(2).replace('-', '−')
export const count = (v: number) => v.toLocaleString('en-GB')
export const shortDate = (iso: string) => iso.slice(0, 10)
