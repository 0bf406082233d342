import { z, type ZodType } from 'zod'

/**
 * Vuetify field rules taken from the shared zod schemas, so the form refuses what the server
 * would refuse, with the same words. `ruleAt(schema, 'thickness.minUm')` walks into objects
 * (through .default(), .nullable() and .refine() wrappers) to the field's own schema.
 */
export type Rule = (value: unknown) => true | string

export function ruleFrom(schema: ZodType, toValue: (v: unknown) => unknown = (v) => v): Rule {
  return (value) => {
    const result = schema.safeParse(toValue(value))
    if (result.success) return true
    const message = result.error.issues[0]?.message ?? 'Not valid'
    if (/received NaN/.test(message)) return 'Enter a number'
    return /^Invalid input: expected/.test(message) ? 'Required' : message
  }
}

function unwrap(schema: ZodType): ZodType {
  let s: ZodType = schema
  // zod 4: default/nullable/optional wrappers expose their inner schema as .unwrap()
  while (!(s instanceof z.ZodObject) && 'unwrap' in s && typeof s.unwrap === 'function') {
    s = (s as unknown as { unwrap: () => ZodType }).unwrap()
  }
  return s
}

export function schemaAt(schema: ZodType, path: string): ZodType {
  let s = schema
  for (const key of path.split('.')) {
    const obj = unwrap(s)
    if (!(obj instanceof z.ZodObject)) throw new Error(`No object at ${key} in ${path}`)
    const next = (obj.shape as Record<string, ZodType>)[key]
    if (!next) throw new Error(`No field ${key} in ${path}`)
    s = next
  }
  return s
}

/** Empty text counts as "no value" (null); numbers typed as text are read as numbers. */
export function numberOrNull(v: unknown): unknown {
  if (v === '' || v === null || v === undefined) return null
  const n = typeof v === 'number' ? v : Number(String(v).replace(',', '.'))
  return Number.isNaN(n) ? v : n
}

export function ruleAt(schema: ZodType, path: string, toValue?: (v: unknown) => unknown): Rule {
  return ruleFrom(schemaAt(schema, path), toValue)
}
