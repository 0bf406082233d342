/**
 * Not a test: writes sample certificates and their page images for a look, and times rendering.
 *   npx tsx tests/unit/pdf/renderPreviews.ts   → test-output/certificates/*.pdf, *.png (git-ignored)
 * Timing: 20 renders of a 2-page 3.1 certificate, each with new numbers and part numbers so no
 * text is laid out in advance; the first (font loading, JIT warm-up) is reported separately.
 */
import { mkdirSync, writeFileSync } from 'node:fs'
import { renderCertificatePdf } from '../../../server/pdf/certificatePdf'
import { fbePart, fortyPartCertificate, harrowgateCertificate } from './certificateFixture'
import { renderPages } from './pdfReading'

const OUT = 'test-output/certificates'

const samples = {
  'coc-3.1-um': harrowgateCertificate(),
  'coc-2.1-supersedes': harrowgateCertificate({ kind: '2.1', supersedes: 'HFW-CoC-2026-00401' }),
  'coc-3.1-40-parts-mil': fortyPartCertificate({
    thicknessUnit: 'mil',
    independenceNote:
      'Released by the recorder: this plant lets the inspector who recorded the readings release small lots.',
  }),
}

function twoPageLot(run: number) {
  const parts = Array.from({ length: 14 }, (_, k) => ({
    ...fbePart(k, {
      n: 9 + k,
      minUm: 250 + run + k * 1.7,
      meanUm: 320 + run * 1.3 + k,
      maxUm: 420 + run + k * 2.1,
    }),
    partNumber: `HFW-${run}-${k * 7919}`,
  }))
  return harrowgateCertificate({
    number: `HFW-CoC-2026-${10000 + run}`,
    lotNumber: `LOT-${77000 + run * 13}`,
    parts,
  })
}

async function main() {
  mkdirSync(OUT, { recursive: true })
  for (const [name, data] of Object.entries(samples)) {
    const pdf = await renderCertificatePdf(data)
    writeFileSync(`${OUT}/${name}.pdf`, pdf)
    const pngs = await renderPages(pdf, 110)
    pngs.forEach((png, i) => writeFileSync(`${OUT}/${name}-page${i + 1}.png`, png))
    console.log(`${name}: ${pngs.length} page(s), ${pdf.length} bytes`)
  }
  const wallMs: number[] = []
  const cpuMs: number[] = []
  let pages = 0
  for (let run = 0; run <= 20; run++) {
    const started = performance.now()
    const cpuBefore = process.cpuUsage()
    const pdf = await renderCertificatePdf(twoPageLot(run))
    wallMs.push(performance.now() - started)
    const cpu = process.cpuUsage(cpuBefore)
    cpuMs.push((cpu.user + cpu.system) / 1000)
    pages = pdf.toString('latin1').match(/\/Type \/Page\b/g)?.length ?? 0
  }
  const [first, ...rest] = wallMs
  rest.sort((a, b) => a - b)
  const cpuRest = cpuMs.slice(1).sort((a, b) => a - b)
  const median = (sorted: number[]) => ((sorted[9] ?? 0) + (sorted[10] ?? 0)) / 2
  console.log(
    `render time, ${pages}-page certificate over ${rest.length} runs: wall median ${median(rest).toFixed(1)} ms ` +
      `(min ${rest[0]?.toFixed(1)}, max ${rest[rest.length - 1]?.toFixed(1)}), ` +
      `CPU median ${median(cpuRest).toFixed(1)} ms; first in process ${first?.toFixed(1)} ms`,
  )
}

await main()
