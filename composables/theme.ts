import { STORAGE_KEY_THEME } from '~/constants'

export type ShopTheme = 'light' | 'dark'

/**
 * The shop theme, kept in a cookie (not localStorage) so the server renders the right colours
 * on the first paint and a dim shop never gets a white flash.
 */
export function useShopTheme() {
  const theme = useCookie<ShopTheme>(STORAGE_KEY_THEME, { default: () => 'light', maxAge: 60 * 60 * 24 * 365, sameSite: 'lax' })
  const toggle = () => { theme.value = theme.value === 'dark' ? 'light' : 'dark' }
  return { theme, toggle }
}
