import type { PaperSize } from '#shared/paper/sizes'

export interface ShopInfo { id: number, name: string, units: 'mm' | 'in', paperSize: PaperSize }

/** The signed-in person's shop and its settings (GET /api/shop), also from the saved copy offline. */
export function useShop() {
  return useCachedFetch<'/api/shop', ShopInfo | null>('/api/shop', { key: 'shop', default: () => null })
}
