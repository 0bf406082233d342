/** The one demo password, stated in the README. Production refuses to start while any account uses it. */
export const DEMO_PASSWORD = 'coat-line-2026'
