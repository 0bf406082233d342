/** Words and looks the QA review screens share. */
import type { Decision, NcStatus } from '@shared/api/review'
import type { CriterionStatus } from '@shared/rules/verdict'
import type { StatusTone } from '@/components/StatusBadge.vue'

export const VERDICT_LOOK: Record<CriterionStatus | 'none', { tone: StatusTone; text: string }> = {
  pass: { tone: 'ok', text: 'Conforms' },
  fail: { tone: 'bad', text: 'Nonconforming' },
  incomplete: { tone: 'warn', text: 'Incomplete' },
  'not-required': { tone: 'neutral', text: 'Not required' },
  none: { tone: 'neutral', text: 'Not judged' },
}

export const NC_STATUS_LOOK: Record<NcStatus, { tone: StatusTone; text: string }> = {
  open: { tone: 'bad', text: 'Open' },
  dispositioned: { tone: 'warn', text: 'Dispositioned' },
  closed: { tone: 'ok', text: 'Closed' },
}

export const DECISION_WORDS: Record<Decision, { verb: string; done: string }> = {
  release: { verb: 'Release', done: 'released' },
  hold: { verb: 'Hold', done: 'put on hold' },
  reject: { verb: 'Reject', done: 'rejected' },
}

/** "3 h ago", "2 d ago": how long a lot has waited, at a glance. */
export function waitedFor(iso: string | null, now = Date.now()): string {
  if (!iso) return '—'
  const minutes = Math.max(0, Math.round((now - new Date(iso).getTime()) / 60_000))
  if (minutes < 60) return `${minutes} min`
  const hours = Math.round(minutes / 60)
  if (hours < 48) return `${hours} h`
  return `${Math.round(hours / 24)} days`
}

export function when(iso: string | null | undefined): string {
  if (!iso) return '—'
  return new Date(iso).toLocaleString([], { dateStyle: 'medium', timeStyle: 'short' })
}

/** Audit actions in words; unknown ones are shown as the server wrote them. */
const ACTION_WORDS: Record<string, string> = {
  'lot.open': 'Lot opened',
  'lot.update': 'Lot changed',
  'lot.submit': 'Sent to review',
  'lot.release': 'Released',
  'lot.hold': 'Put on hold',
  'lot.reject': 'Rejected',
  'lot.reopen': 'Reopened',
  'lot.open-for-retest': 'Back on the floor for a retest',
  'part.create': 'Part added',
  'part.update': 'Part changed',
  'part.retest-round': 'Retest round opened',
  'part.scrap': 'Part scrapped',
  'section.record': 'Inspection recorded',
  'readings.record': 'Gauge readings recorded',
  'readings.suspect': 'Readings marked suspect',
  'reading.discard': 'Reading discarded',
  'nonconformance.open': 'Nonconformance opened',
  'nonconformance.disposition': 'Disposition given',
  'nonconformance.close': 'Nonconformance closed',
  'photo.upload': 'Photo added',
  'certificate.issue': 'Certificate issued',
  'certificate.resend': 'Certificate sent again',
  'certificate.revoke': 'Certificate revoked',
  'defect-type.create': 'Defect type added',
  'defect-type.update': 'Defect type changed',
}
export function actionWords(action: string): string {
  return ACTION_WORDS[action] ?? action
}
