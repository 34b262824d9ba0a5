// The signed-in person with their preferences (units), read by the top bar of every screen. A
// file of its own, so the Run screen does not load every other resource's reads with it
// (composables/resources.ts holds the rest; issue 14).
export const ME_KEY = 'me'

export const useMe = () => useFetch('/api/me', { key: ME_KEY })
