import type { H3Event } from 'h3'
import type { Role } from '#shared/types/roles'

export interface ShopUser { id: number, shopId: number, name: string, email: string, role: Role, language: string | null }

/**
 * The signed-in person, re-read from the database on every call so that a role change or a
 * deactivation takes effect at once rather than when the cookie expires.
 */
export async function requireShopUser(event: H3Event): Promise<ShopUser> {
  if (event.context.shopUser) return event.context.shopUser as ShopUser
  // The cookie is opened once a minute at most (session-cache.ts)
  const session = await readSessionKept(event, () => getUserSession(event))
  if (!session.user) throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'Sign in first.' })
  // The person, and whether this cookie is a copy from before a sign-out (session-revocation.ts),
  // in one statement: every API request asks both (issue 14; queryEscaped, db.ts).
  type Row = { id: number, shopId: number, name: string, email: string, role: Role, active: number, language: string | null, revokedUntil: string | null }
  const [row] = await queryEscaped<Row>(useDB(),
    `select u.id, u.shop_id as shopId, u.name, u.email, u.role, u.active, u.language, s.until as revokedUntil
     from users u left join revoked_sessions s on s.session_id = ? where u.id = ? limit 1`,
    [revokedKey(session.id), session.user.id])
  if (row?.revokedUntil && utcTimestamp(row.revokedUntil).getTime() > Date.now()) {
    forgetOpenedSession(event)
    await clearUserSession(event)
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'This sign-in has ended. Sign in again.' })
  }
  if (!row || !row.active) {
    forgetOpenedSession(event)
    await clearUserSession(event)
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'This sign-in is no longer valid. Sign in again.' })
  }
  const user: ShopUser = { id: row.id, shopId: row.shopId, name: row.name, email: row.email, role: row.role, language: row.language }
  event.context.shopUser = user
  return user
}

/** The one role check: 403 with a plain reason when the signed-in role is not allowed. */
export async function requireRole(event: H3Event, ...roles: Role[]): Promise<ShopUser> {
  const user = await requireShopUser(event)
  if (!roles.includes(user.role)) {
    throw createError({
      statusCode: 403,
      statusMessage: 'Forbidden',
      message: `This needs the ${roles.join(' or ')} role; you are signed in as ${user.role}.`,
    })
  }
  return user
}
