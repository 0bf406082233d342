/** Fixed decimals with a true minus sign, the way the page shows an index ("0.80", "−0.12"). */
export function formatNumber(value: number, decimals: number): string {
  const s = value.toFixed(decimals)
  return s.startsWith('-') ? `−${s.slice(1)}` : s
}
