import type { CertificateState, DeliveryState } from '@shared/api/certificates'
import type { StatusTone } from '@/components/StatusBadge.vue'

/** Each state has its own shape and word (StatusBadge), never colour alone. */
export const CERTIFICATE_STATE_LOOK: Record<CertificateState, { tone: StatusTone; text: string }> =
  {
    valid: { tone: 'ok', text: 'Valid' },
    superseded: { tone: 'warn', text: 'Replaced' },
    revoked: { tone: 'bad', text: 'Withdrawn' },
  }

export const DELIVERY_LOOK: Record<DeliveryState, { tone: StatusTone; text: string }> = {
  queued: { tone: 'neutral', text: 'Waiting to send' },
  sent: { tone: 'ok', text: 'Sent' },
  failed: { tone: 'bad', text: 'Not delivered' },
}

export function dateTime(iso: string | null | undefined): string {
  return iso ? new Date(iso).toLocaleString([], { dateStyle: 'medium', timeStyle: 'short' }) : '—'
}

export function dateOnly(iso: string | null | undefined): string {
  return iso ? new Date(iso).toLocaleDateString([], { dateStyle: 'medium' }) : '—'
}
