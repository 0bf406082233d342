/**
 * Invented certificate data: the plant "Harrowgate Flow Works" and the customer "Tarnbeck Water
 * Services" do not exist; addresses and URLs use .example. Thickness statistics are µm, as the
 * server hands them over; the expected printed values are worked out by hand in the tests.
 */
import type { CertificateData } from '../../../shared/api/certificates'

type Part = CertificateData['parts'][number]

export function fbePart(
  index: number,
  thicknessUm: { n: number; minUm: number; meanUm: number; maxUm: number } | null,
): Part {
  const no = String(index + 1).padStart(3, '0')
  return {
    partNumber: `HFW-VB-${no}`,
    description: index % 3 === 0 ? 'Gate valve body DN150 PN16' : 'Flanged tee DN100',
    heatNumber: `H24-${7310 + index}`,
    quantity: 1 + (index % 4),
    thickness: thicknessUm,
    verdict: 'Pass',
  }
}

export function harrowgateCertificate(overrides: Partial<CertificateData> = {}): CertificateData {
  return {
    number: 'HFW-CoC-2026-00418',
    kind: '3.1',
    issuedAt: '2026-05-14T09:30:00.000Z',
    verifyUrl: 'https://certs.harrowgate.example/verify/7QK2-M9XD-R4TA',
    issuer: {
      name: 'Harrowgate Flow Works',
      address: 'Unit 4, Calder Reach Industrial Estate, Harrowgate HG9 2ZZ, United Kingdom',
    },
    customer: {
      name: 'Tarnbeck Water Services',
      address: '18 Fellside Road, Tarnbeck TB3 1XX, United Kingdom',
    },
    orderRef: 'PO-TWS-55120 / item 3',
    lotNumber: 'LOT-2026-0517',
    line: 'FBE line 2',
    shift: 'Early (06:00–14:00)',
    coating: {
      material: 'Fusion-bonded epoxy powder, green (potable water grade)',
      batchNumber: 'PB-88341',
      batchExpiresOn: '2027-01-31',
    },
    spec: {
      code: 'HFW-SPEC-FBE-01',
      title: 'FBE internal and external lining of valve bodies for potable water',
      version: 3,
      acceptanceRule: 'SSPC-PA 2 restriction level 3, spot means within the band',
      band: '250–500 µm',
    },
    thicknessUnit: 'um',
    parts: [
      fbePart(0, { n: 15, minUm: 287.4, meanUm: 341.6, maxUm: 402.2 }),
      fbePart(1, { n: 12, minUm: 301.0, meanUm: 355.5, maxUm: 418.7 }),
      fbePart(2, { n: 9, minUm: 276.2, meanUm: 322.9, maxUm: 389.5 }),
    ],
    surfacePrep: {
      gradeRequired: 'Sa 2½ (ISO 8501-1)',
      gradesRecorded: 'Sa 2½ on all parts',
      profileBand: '50–100 µm',
      profileRecorded: '62–81 µm (replica tape)',
    },
    climate: {
      summary:
        'Steel 8–11 °C above dew point; relative humidity 41–52 %; air 17–19 °C during blasting and coating.',
    },
    holiday: {
      method: 'ASTM D5162 method B, high-voltage spark',
      voltage: '1,900 V',
      result: 'No holidays found',
    },
    cure: ['MEK rub test: 50 double rubs, no softening', 'DSC ΔTg 1.8 °C (limit ≤ 3 °C)'],
    adhesion: ['Hot-water soak 24 h at 75 °C: rating 1'],
    nonconformances: [
      {
        number: 'NC-2026-031',
        defect: 'Thin film on flange face of HFW-VB-002 (first spot mean below band)',
        disposition: 'Recoated and re-inspected',
        concessionRef: null,
        closed: true,
      },
    ],
    statement:
      'We certify that the parts listed above were coated and inspected in accordance with the ' +
      'specification named on this certificate and conform to it.',
    inspectedBy: [{ name: 'Priya Ashcombe', date: '2026-05-13' }],
    approvedBy: { name: 'Tomasz Wrenfield', date: '2026-05-14' },
    independenceNote: null,
    supersedes: null,
    ...overrides,
  }
}

/** A long lot: 40 parts, so the table must flow onto further pages. */
export function fortyPartCertificate(overrides: Partial<CertificateData> = {}): CertificateData {
  const parts = Array.from({ length: 40 }, (_, i) =>
    fbePart(i, { n: 10 + (i % 6), minUm: 270 + i, meanUm: 330 + i, maxUm: 400 + i }),
  )
  return harrowgateCertificate({ number: 'HFW-CoC-2026-00419', parts, ...overrides })
}
