import { mount, type ComponentMountingOptions } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createVuetify } from 'vuetify'
import * as components from 'vuetify/components'
import * as directives from 'vuetify/directives'
import type { Component } from 'vue'
import { filmtrailLight } from '../../src/plugins/vuetify'

/** Mounts a component with Vuetify (our theme) and a fresh Pinia, as main.ts would. */
export function mountWithVuetify<C extends Component>(
  component: C,
  options: ComponentMountingOptions<C> & { pinia?: Pinia } = {},
) {
  const pinia = options.pinia ?? createPinia()
  setActivePinia(pinia)
  const vuetify = createVuetify({
    components,
    directives,
    theme: { defaultTheme: 'filmtrailLight', themes: { filmtrailLight } },
  })
  const { global, ...rest } = options
  return mount(component, {
    ...rest,
    global: { ...global, plugins: [vuetify, pinia, ...(global?.plugins ?? [])] },
  } as never)
}
