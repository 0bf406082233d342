/**
 * chart.js for Line health: only the pieces these charts use are registered (tree-shaken), plus
 * our own colours. The palette steps through clearly different greys (dark teal, mid orange,
 * light sand, dark slate), and every series also differs by line dash, point shape or a hatch
 * pattern, so a chart printed in black and white or read by a colour-blind eye still separates.
 */
import {
  BarController,
  BarElement,
  CategoryScale,
  Chart,
  Legend,
  LinearScale,
  LineController,
  LineElement,
  PointElement,
  Tooltip,
  type Plugin,
} from 'chart.js'

Chart.register(
  BarController,
  LineController,
  BarElement,
  LineElement,
  PointElement,
  CategoryScale,
  LinearScale,
  Tooltip,
  Legend,
)
Chart.defaults.font.family = 'Roboto, system-ui, sans-serif'
Chart.defaults.font.size = 13
Chart.defaults.color = '#2B2B2B'

export const TREND_COLOURS = {
  /** grey ≈ 30 % */
  teal: '#1F5E63',
  /** grey ≈ 50 % */
  orange: '#C46A1B',
  /** grey ≈ 78 % */
  sand: '#D8C29A',
  /** grey ≈ 25 %, used with a dash */
  slate: '#3D4A4C',
  grid: 'rgba(0, 0, 0, 0.08)',
} as const

export const DASH = { solid: [] as number[], dashed: [6, 4], dotted: [2, 3], long: [12, 5] }

/** Diagonal hatching: bars that must stand out without colour (out of band, a shift). */
export function hatch(
  colour: string,
  background = '#FFFFFF',
  reverse = false,
): CanvasPattern | string {
  if (typeof document === 'undefined') return colour
  const c = document.createElement('canvas')
  c.width = c.height = 8
  const g = c.getContext('2d')
  if (!g) return colour
  g.fillStyle = background
  g.fillRect(0, 0, 8, 8)
  g.strokeStyle = colour
  g.lineWidth = 2
  g.beginPath()
  if (reverse) {
    g.moveTo(0, 0)
    g.lineTo(8, 8)
  } else {
    g.moveTo(0, 8)
    g.lineTo(8, 0)
  }
  g.stroke()
  return g.createPattern(c, 'repeat') ?? colour
}

export interface BandLinesOptions {
  /** Category edges (0 = left of the first bar) where the spec limits sit, with labels. */
  edges: { at: number; label: string }[]
}

/**
 * Vertical spec-limit lines on a histogram whose bins are aligned with the band, drawn between
 * category slots (no annotation plugin needed). Solid dark teal, labelled at the top.
 */
export const bandLinesPlugin: Plugin<'bar', BandLinesOptions> = {
  id: 'bandLines',
  afterDatasetsDraw(chart, _args, opts) {
    const x = chart.scales.x
    const area = chart.chartArea
    if (!x || !opts?.edges?.length) return
    const n = chart.data.labels?.length ?? 0
    if (n === 0) return
    const step = n > 1 ? x.getPixelForValue(1) - x.getPixelForValue(0) : area.right - area.left
    const g = chart.ctx
    g.save()
    g.strokeStyle = TREND_COLOURS.teal
    g.fillStyle = TREND_COLOURS.teal
    g.lineWidth = 2
    g.font = '600 12px Roboto, system-ui, sans-serif'
    g.textAlign = 'center'
    for (const e of opts.edges) {
      const px = x.getPixelForValue(0) - step / 2 + e.at * step
      g.beginPath()
      g.moveTo(px, area.top + 14)
      g.lineTo(px, area.bottom)
      g.stroke()
      // Labels at the plot's edges are aligned inwards so they are never cut off.
      g.textAlign = px - area.left < 40 ? 'left' : area.right - px < 40 ? 'right' : 'center'
      g.fillText(
        e.label,
        px + (g.textAlign === 'left' ? 4 : g.textAlign === 'right' ? -4 : 0),
        area.top + 10,
      )
    }
    g.restore()
  },
}

/** Common options: no animation (a report, not a show), legend at the bottom, light grid. */
export function baseOptions() {
  return {
    responsive: true,
    maintainAspectRatio: false,
    animation: false as const,
    plugins: {
      legend: { position: 'bottom' as const, labels: { usePointStyle: true, boxWidth: 28 } },
    },
    scales: {
      x: { grid: { color: TREND_COLOURS.grid } },
      y: { grid: { color: TREND_COLOURS.grid }, beginAtZero: true },
    },
  }
}
