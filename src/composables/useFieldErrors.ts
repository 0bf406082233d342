import { computed, inject, provide, ref, type InjectionKey, type Ref } from 'vue'
import type { ZodError } from 'zod'
import type { ApiError, FieldIssue } from '@/services/api'

/**
 * One form's field messages, keyed by the schema path ("content.thickness.maxUm"). They come
 * either from the shared zod schema checked before sending, or from the server's 400 details:
 * both use the same paths, so a message lands next to the same field either way.
 */
export type FieldErrors = Ref<Record<string, string[]>>
const KEY: InjectionKey<FieldErrors> = Symbol('fieldErrors')

/** zod's type messages are for programmers; an inspector reads "Required". */
function readable(message: string): string {
  if (/received NaN/.test(message)) return 'Enter a number'
  return /^Invalid input: expected (number|string), received (null|undefined)/.test(message)
    ? 'Required'
    : message
}

export function issuesFromZod(error: ZodError): FieldIssue[] {
  return error.issues.map((i) => ({ field: i.path.join('.'), message: readable(i.message) }))
}

export function provideFieldErrors() {
  const errors: FieldErrors = ref({})
  provide(KEY, errors)
  function set(issues: FieldIssue[]) {
    const next: Record<string, string[]> = {}
    for (const i of issues) (next[i.field] ??= []).push(readable(i.message))
    errors.value = next
  }
  return {
    errors,
    set,
    clear: () => set([]),
    fromApiError: (e: ApiError | null) => set(e?.fieldIssues ?? []),
  }
}

/** A field's messages; `path` is relative to the form's root. */
export function useFieldError(path: () => string | undefined) {
  const errors = inject(KEY, ref<Record<string, string[]>>({}))
  return computed(() => {
    const p = path()
    return p ? (errors.value[p] ?? []) : []
  })
}

/** For sections with many fields: `fe('content.holiday.method')`. */
export function useFieldErrorLookup() {
  const errors = inject(KEY, ref<Record<string, string[]>>({}))
  return (path: string) => errors.value[path] ?? []
}
