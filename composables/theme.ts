import { STORAGE_KEY_THEME } from '~/constants'

export type ShopTheme = 'light' | 'dark'

/**
 * The shop theme, kept in a cookie (not localStorage) so the server renders the right colours
 * on the first paint and a dim shop never gets a white flash.
 */
export function useShopTheme() {
  const theme = useState<ShopTheme>(STORAGE_KEY_THEME, () => startingCookie(STORAGE_KEY_THEME) === 'dark' ? 'dark' : 'light')
  const toggle = () => {
    theme.value = theme.value === 'dark' ? 'light' : 'dark'
    rememberInCookie(STORAGE_KEY_THEME, theme.value)
  }
  return { theme, toggle }
}
