import { UserSession } from '../../../db/models'

// The devices the signed-in person is signed in on, this one first.
export default defineEventHandler(async (event) => {
  const { id } = await requireUser(event)
  const mine = sessionIdHash(await currentSid(event))
  const rows = await UserSession.findAll({ where: { userId: id, endedAt: null }, order: [['lastSeenAt', 'DESC']] })
  return rows
    .map(s => ({ id: s.id, device: s.device, address: s.address, signedInAt: s.createdAt, lastSeenAt: s.lastSeenAt, current: s.sidHash === mine }))
    .sort((a, b) => Number(b.current) - Number(a.current))
})
