// Vuetify's layers, reset and utility classes; each component's own CSS comes with it through
// vite-plugin-vuetify. The named colour palette (bg-red-lighten-2 …) is left out: we use theme colours.
import 'vuetify/styles/layers'
import 'vuetify/styles/core'
import 'vuetify/styles/utilities'
import { createVuetify, type ThemeDefinition } from 'vuetify'
import { aliases, mdi } from 'vuetify/iconsets/mdi-svg'

/**
 * Filmtrail's own look: deep teal for the line's structure, burnt orange for the one thing to
 * look at, warm paper behind. Status colours are never the only signal: every status also has an
 * icon shape and a word (see StatusBadge.vue).
 */
export const filmtrailLight: ThemeDefinition = {
  dark: false,
  colors: {
    primary: '#1F5E63',
    secondary: '#3D4A4C',
    accent: '#C46A1B',
    background: '#F4F2EE',
    surface: '#FFFFFF',
    'surface-variant': '#E6E1D8',
    'on-surface-variant': '#2B2B2B',
    error: '#B3261E',
    success: '#2E7D4F',
    // Darker than a typical amber so its text stays ≥ 4.5:1 on white and on its tonal tint.
    warning: '#8F5B00',
    info: '#2C5F8A',
  },
  // Vuetify's 0.60 puts hints, subtitles and field labels at 4.3:1 on white (axe, WCAG 1.4.3 AA
  // needs 4.5:1); 0.70 gives about 5.9:1 on white and 5.3:1 on the paper background.
  variables: { 'medium-emphasis-opacity': 0.7 },
}

export const vuetify = createVuetify({
  theme: { defaultTheme: 'filmtrailLight', themes: { filmtrailLight } },
  icons: { defaultSet: 'mdi', aliases, sets: { mdi } },
  defaults: {
    // Gloved fingers at the line: comfortable density and 48 px targets by default.
    VBtn: { size: 'large', rounded: 'lg', minHeight: 48 },
    VTextField: { variant: 'outlined', color: 'primary' },
    VTextarea: { variant: 'outlined', color: 'primary' },
    VSelect: { variant: 'outlined', color: 'primary' },
    VAutocomplete: { variant: 'outlined', color: 'primary' },
    VSwitch: { color: 'primary', inset: true },
    VCheckbox: { color: 'primary' },
    VCard: { rounded: 'lg' },
    VAlert: { variant: 'tonal' },
    VListItem: { minHeight: 48 },
  },
})
