import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { createMemoryHistory, createRouter } from 'vue-router'
import { mountWithVuetify } from './mountWithVuetify'
import SignInView from '../../src/views/SignInView.vue'

/** The sign-in form says what the server said: a person must know whether to retry or wait. */
function answer(status: number, body: unknown) {
  return vi.fn(
    async () =>
      new Response(JSON.stringify(body), {
        status,
        headers: { 'Content-Type': 'application/json' },
      }),
  )
}

async function submitWith(fetchStub: ReturnType<typeof answer>) {
  vi.stubGlobal('fetch', fetchStub)
  const router = createRouter({
    history: createMemoryHistory(),
    routes: [
      { path: '/sign-in', name: 'sign-in', component: SignInView },
      { path: '/', name: 'home', component: { template: '<p>home</p>' } },
    ],
  })
  await router.push('/sign-in')
  const wrapper = mountWithVuetify(SignInView, {
    global: { plugins: [router] },
    attachTo: document.body,
  })
  await wrapper.get('input[name="email"]').setValue('admin@harrowgate.example')
  await wrapper.get('input[name="password"]').setValue('wrong-password-1')
  await wrapper.get('form').trigger('submit')
  await flushPromises()
  await new Promise((r) => setTimeout(r, 50))
  await flushPromises()
  return { wrapper, router }
}

afterEach(() => {
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

describe('sign-in shows the server’s refusal', () => {
  it('shows “E-mail or password is not right” on a 401 and clears the password', async () => {
    const fetchStub = answer(401, {
      error: { code: 'bad_credentials', message: 'E-mail or password is not right' },
    })
    const { wrapper, router } = await submitWith(fetchStub)
    expect(fetchStub).toHaveBeenCalledOnce()
    expect(wrapper.get('[data-test="sign-in-error"]').text()).toContain(
      'E-mail or password is not right',
    )
    expect((wrapper.get('input[name="password"]').element as HTMLInputElement).value).toBe('')
    expect(router.currentRoute.value.name).toBe('sign-in')
  })

  it('shows the lockout message as the server words it (423)', async () => {
    const message =
      'Too many failed sign-ins: this account is locked for 15 more minute(s), or until an admin resets its password'
    const { wrapper } = await submitWith(
      answer(423, { error: { code: 'account_locked', message } }),
    )
    expect(wrapper.get('[data-test="sign-in-error"]').text()).toContain(message)
  })
})

describe('the password can be shown, by mouse or keyboard, with a name a screen reader reads', () => {
  it('toggles the field between hidden and shown and says which it will do', async () => {
    const router = createRouter({
      history: createMemoryHistory(),
      routes: [{ path: '/sign-in', name: 'sign-in', component: SignInView }],
    })
    await router.push('/sign-in')
    const wrapper = mountWithVuetify(SignInView, {
      global: { plugins: [router] },
      attachTo: document.body,
    })
    const input = () => wrapper.get('input[name="password"]').element as HTMLInputElement
    const toggle = () => wrapper.get('[data-test="password-visibility"]')
    expect(input().type).toBe('password')
    expect(toggle().attributes('aria-label')).toBe('Show the password')
    await toggle().trigger('click')
    expect(input().type).toBe('text')
    expect(toggle().attributes('aria-label')).toBe('Hide the password')
    await toggle().trigger('keydown', { key: 'Enter' })
    expect(input().type).toBe('password')
  })
})
