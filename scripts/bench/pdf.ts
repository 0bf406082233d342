/**
 * certificate_pdf_median_ms: renderCertificatePdf of a 2-page EN 10204 3.1 certificate (the
 * page count is checked), fonts preloaded as the server does at start. Every run has new numbers
 * and part numbers, so no text was laid out by an earlier run.
 */
import { median } from './load'

export async function measureCertificatePdf(
  runs: number,
): Promise<{ medianMs: number; pages: number }> {
  const { renderCertificatePdf, preloadCertificateFonts } =
    await import('../../server/pdf/certificatePdf')
  const { fbePart, harrowgateCertificate } = await import('../../tests/unit/pdf/certificateFixture')
  await preloadCertificateFonts()
  const twoPageLot = (run: number) =>
    harrowgateCertificate({
      number: `HFW-CoC-2026-${20000 + run}`,
      lotNumber: `LOT-${88000 + run * 17}`,
      parts: Array.from({ length: 14 }, (_, k) => ({
        ...fbePart(k, {
          n: 9 + k,
          minUm: 250 + run + k * 1.7,
          meanUm: 320 + run * 1.3 + k,
          maxUm: 420 + run + k * 2.1,
        }),
        partNumber: `HFW-${run}-${k * 7919}`,
      })),
    })
  const ms: number[] = []
  let pages = 0
  for (let run = 0; run < runs + 2; run++) {
    const t0 = performance.now()
    const pdf = await renderCertificatePdf(twoPageLot(run))
    const elapsed = performance.now() - t0
    pages = pdf.toString('latin1').match(/\/Type \/Page\b/g)?.length ?? 0
    if (pages !== 2) throw new Error(`the bench certificate has ${pages} pages, not 2`)
    if (run >= 2) ms.push(elapsed) // the first two warm the JIT
  }
  return { medianMs: median(ms), pages }
}
