import type { PartDraft } from './FloorPartFields.vue'

export const emptyPart = (): PartDraft => ({
  partNumber: '',
  description: '',
  heatNumber: '',
  quantity: 1,
  coatedAreaM2: null,
})

/** The API body of a part, with the clientId made now (on save). */
export function partBody(p: PartDraft) {
  return {
    clientId: crypto.randomUUID(),
    partNumber: p.partNumber.trim(),
    description: p.description.trim(),
    heatNumber: p.heatNumber.trim(),
    quantity: p.quantity ?? 1,
    coatedAreaM2: p.coatedAreaM2 && p.coatedAreaM2 > 0 ? p.coatedAreaM2 : null,
  }
}
