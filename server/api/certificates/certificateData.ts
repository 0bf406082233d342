/**
 * CertificateData from a released lot: what the PDF prints (server/pdf renders it). Pure, so the
 * same source always gives the same data and the same content fingerprint.
 */
import type { CertificateData, CertificateKind } from '../../../shared/api/certificates'
import { LINE_LABELS } from '../../../shared/api/lots'
import { DISPOSITION_LABELS } from '../../../shared/api/review'
import { assemblePartInput } from '../../../shared/inspection/assemblePartInput'
import type { PartVerdict } from '../../../shared/rules/evaluatePart'
import type { SpecContent } from '../../../shared/spec/specContent'
import type { PlantSettings } from '../../../shared/api/setup'
import type { CertificateSource, SourceNc, SourcePart } from './certificateSource'
import {
  acceptanceRuleText,
  adhesionLines,
  bandText,
  climateSummary,
  cureLines,
  holidaySummary,
  surfacePrepSummary,
} from './certificateSummaries'
import { filmReadingsUm, thicknessStats } from './thicknessStats'

export interface IssueFacts {
  number: string
  kind: CertificateKind
  issuedAt: string
  verifyUrl: string
  supersedes: string | null
}

const STATUS_WORDS = { pass: 'Pass', fail: 'Nonconforming', incomplete: 'Not complete' } as const

function partVerdictText(part: SourcePart, ncs: SourceNc[], sampleMode: boolean): string {
  if (sampleMode && !part.sampled) return 'Not sampled'
  const status = part.verdict?.status ?? 'incomplete'
  if (status === 'pass') return 'Pass'
  const concession = ncs.find(
    (n) => n.disposition === 'use-as-is' && n.concession_ref && n.part_ids.includes(part.id),
  )
  return concession ? `Concession ${concession.concession_ref}` : STATUS_WORDS[status]
}

function statementFor(
  kind: CertificateKind,
  src: CertificateSource,
  spec: { code: string; version: number },
  shipped: number,
  scrapped: number,
  concessions: boolean,
): string {
  const what = `the ${shipped} part${shipped === 1 ? '' : 's'} listed above (lot ${src.lot.lot_number}, order ${src.lot.order_ref})`
  const against = `${spec.code} version ${spec.version}`
  const lines = [
    kind === '2.1'
      ? `We declare that ${what} were prepared and coated in accordance with ${against} and comply with it. As an EN 10204 type 2.1 declaration, this certificate gives no test results.`
      : `We certify that ${what} were prepared, coated and inspected in accordance with ${against} and conform to it.`,
  ]
  if (kind === '3.1')
    lines.push(
      'The results are those of the specific inspection of this lot, validated by the plant’s inspection representative.',
    )
  if (kind === '2.2')
    lines.push('The results are those of the plant’s own inspection during production.')
  if (concessions)
    lines.push(
      'Parts marked “Concession” were accepted on the customer’s written concession named under Nonconformances.',
    )
  if (scrapped)
    lines.push(
      `${scrapped} part${scrapped === 1 ? ' was' : 's were'} scrapped during inspection and ${scrapped === 1 ? 'is' : 'are'} not part of this delivery.`,
    )
  return lines.join(' ')
}

export function buildCertificateData(
  src: CertificateSource,
  spec: SpecContent,
  plant: PlantSettings,
  facts: IssueFacts,
): CertificateData {
  const unit = src.lot.thickness_unit
  const sampleMode = spec.sampling.mode === 'sample'
  const shipped = src.parts.filter((p) => p.scrapped_by_nc === null)
  const scrapped = src.parts.length - shipped.length
  const verdicts = shipped.flatMap((p) => (p.verdict ? [p.verdict] : [])) as PartVerdict[]
  const parts = shipped.map((p) => {
    const input = assemblePartInput(
      spec.thickness.rule,
      p.round,
      p.sections ?? [],
      p.readings ?? [],
      p.carried_sections ?? [],
    )
    return {
      partNumber: p.part_number,
      description: p.description,
      heatNumber: p.heat_number,
      quantity: p.quantity,
      thickness: thicknessStats(filmReadingsUm(spec, input)),
      verdict: partVerdictText(p, src.nonconformances, sampleMode),
    }
  })
  const specFacts = { code: src.lot.spec_code, version: src.lot.spec_version }
  return {
    number: facts.number,
    kind: facts.kind,
    issuedAt: facts.issuedAt,
    verifyUrl: facts.verifyUrl,
    issuer: { name: plant.plantName, address: plant.plantAddress },
    customer: { name: src.lot.customer_name, address: src.lot.customer_address },
    orderRef: src.lot.order_ref,
    lotNumber: src.lot.lot_number,
    line: LINE_LABELS[src.lot.line] ?? src.lot.line,
    shift: `Shift ${src.lot.shift}`,
    coating: {
      material: src.lot.coating_material,
      batchNumber: src.lot.batch_number,
      batchExpiresOn: src.lot.batch_expires_on,
    },
    spec: {
      code: src.lot.spec_code,
      title: src.lot.spec_title,
      version: src.lot.spec_version,
      acceptanceRule: acceptanceRuleText(spec),
      band: bandText(spec, unit),
    },
    thicknessUnit: unit,
    parts,
    surfacePrep: surfacePrepSummary(spec, verdicts, unit),
    climate: climateSummary(spec, verdicts),
    holiday: holidaySummary(spec, verdicts),
    cure: cureLines(spec, verdicts),
    adhesion: adhesionLines(spec, verdicts),
    nonconformances: src.nonconformances.map((n) => ({
      number: n.number,
      defect: `${n.defect_label}: ${n.description}`,
      disposition: n.disposition ? DISPOSITION_LABELS[n.disposition] : 'Not yet decided',
      concessionRef: n.concession_ref,
      closed: n.status === 'closed',
    })),
    statement: statementFor(
      facts.kind,
      src,
      specFacts,
      shipped.length,
      scrapped,
      parts.some((p) => p.verdict.startsWith('Concession')),
    ),
    inspectedBy: src.inspectors,
    approvedBy: src.release
      ? { name: src.release.name, date: src.release.date }
      : { name: '—', date: facts.issuedAt.slice(0, 10) },
    independenceNote: src.release?.independence_waived
      ? `Released by ${src.release.name}, who also recorded inspection results of this lot: the plant’s setting allows this, so the release was not independent of the inspection.`
      : null,
    supersedes: facts.supersedes,
  }
}
