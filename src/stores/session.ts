import { computed, ref } from 'vue'
import { defineStore } from 'pinia'
import type { SessionUser } from '@shared/api/auth'
import { authApi, type UnitPreferences } from '@/services/auth'

const TOKEN_KEY = 'filmtrail.token'

/** Who is signed in, their token and their unit preferences: shared by every page. */
export const useSessionStore = defineStore('session', () => {
  const token = ref<string | null>(localStorage.getItem(TOKEN_KEY))
  const user = ref<SessionUser | null>(null)
  const signedIn = computed(() => token.value !== null && user.value !== null)
  const role = computed(() => user.value?.role ?? null)

  const units = computed(() => ({
    thickness: user.value?.thicknessUnit ?? 'um',
    temperature: user.value?.temperatureUnit ?? 'C',
    area: user.value?.areaUnit ?? 'm2',
  }))

  function setToken(next: string | null) {
    token.value = next
    if (next) localStorage.setItem(TOKEN_KEY, next)
    else localStorage.removeItem(TOKEN_KEY)
  }

  async function signIn(email: string, password: string) {
    const res = await authApi.login({ email, password })
    setToken(res.token)
    user.value = res.user
    return res.user
  }

  /** After a reload: the token survives in localStorage, the user is fetched again. */
  async function restore(): Promise<boolean> {
    if (!token.value) return false
    if (user.value) return true
    try {
      user.value = (await authApi.me()).user
      return true
    } catch {
      clear()
      return false
    }
  }

  async function setPreferences(prefs: UnitPreferences) {
    user.value = (await authApi.setPreferences(prefs)).user
  }

  function clear() {
    setToken(null)
    user.value = null
  }

  return { token, user, signedIn, role, units, signIn, restore, setPreferences, clear }
})
