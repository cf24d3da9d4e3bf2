// Night (dark, the default at the instrument) or day theme, remembered in a cookie so the server
// renders the right one and nothing flashes.
export type Theme = 'dark' | 'light'

export function useTheme() {
  return useCookie<Theme>('tessera-theme', { default: () => 'dark', sameSite: 'lax', maxAge: 60 * 60 * 24 * 365 })
}
