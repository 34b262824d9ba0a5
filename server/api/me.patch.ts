import { MePatchSchema } from '#shared/schemas/language'

// The signed-in person chooses their own language (the Floor and the profile). The session
// keeps a copy, so the next page load on any tablet opens in it.
export default defineEventHandler(async (event) => {
  const user = await requireShopUser(event)
  const { language } = await readValid(event, MePatchSchema)
  if (language !== null && !isLanguage(language)) {
    throw invalidInput('language', `Jogwise has no ${language} screens; choose one of ${LANGUAGES.join(', ')}.`)
  }
  // The person's own row
  await useDB().update(tables.users).set({ language }).where(and(eq(tables.users.id, user.id), eq(tables.users.shopId, user.shopId)))
  event.context.shopUser = { ...user, language }
  const session = await getUserSession(event)
  if (session.user) await setUserSession(event, { user: { ...session.user, language } })
  return { language }
})
