// Starts replaying the offline queue as soon as the app runs in the browser.
export default defineNuxtPlugin(() => {
  useSyncStore().start()
})
