import { createApp } from 'vue'
import { createPinia } from 'pinia'
// Roboto in the scripts the product writes: Latin and its extensions (names, µm, °C, ±) and the
// math subset (√ of the holiday voltage formula). Greek, Cyrillic and Vietnamese text, should a
// name hold any, shows in the tablet's own sans-serif instead of shipping 18 more @font-face rules.
import '@fontsource/roboto/latin-400.css'
import '@fontsource/roboto/latin-ext-400.css'
import '@fontsource/roboto/math-400.css'
import '@fontsource/roboto/latin-500.css'
import '@fontsource/roboto/latin-ext-500.css'
import '@fontsource/roboto/math-500.css'
import '@fontsource/roboto/latin-700.css'
import '@fontsource/roboto/latin-ext-700.css'
import '@fontsource/roboto/math-700.css'
import { vuetify } from './plugins/vuetify'
import './styles/app.css'
import App from './App.vue'
import { router } from './router'
import { configureApi } from './services/api'
import { useSessionStore } from './stores/session'
import { ROUTES } from './router/routeNames'

const app = createApp(App)
const pinia = createPinia()
app.use(pinia)

const session = useSessionStore(pinia)
configureApi({
  getToken: () => session.token,
  // A 401 on a request that carried a token means the session ended (expired, reset, deactivated).
  onSessionEnded: () => {
    session.clear()
    const current = router.currentRoute.value
    if (current.name !== ROUTES.signIn) {
      void router.push({ name: ROUTES.signIn, query: { redirect: current.fullPath, ended: '1' } })
    }
  },
})

app.use(router)
app.use(vuetify)
app.mount('#app')
