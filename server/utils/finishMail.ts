import { Membership, Piece, Project, User } from '../db/models'

/**
 * Tells the studio's owners that a project is finished. A mail that cannot be sent is logged,
 * never an error for the knitter whose last row just synced.
 */
export async function mailProjectFinished(projectId: number) {
  try {
    const project = await Project.findByPk(projectId, { attributes: ['id', 'studioId', 'name', 'knitterId'] })
    if (!project) return
    const [knitter, pieces, owners] = await Promise.all([
      User.findByPk(project.knitterId, { attributes: ['name'] }),
      Piece.findAll({ where: { projectId }, attributes: ['name', 'totalRows'] }),
      Membership.findAll({ where: { studioId: project.studioId, role: 'owner' }, include: [{ model: User, attributes: ['email'] }] }),
    ])
    const rows = pieces.reduce((n, p) => n + p.totalRows, 0)
    const text = [
      `${knitter?.name ?? 'A knitter'} has finished "${project.name}": ${pieces.length} ${pieces.length === 1 ? 'piece' : 'pieces'} (${pieces.map(p => p.name).join(', ')}), ${rows} machine rows.`,
      '',
      `See it in Floatwise: ${appLink(`/projects/${project.id}`)}`,
    ].join('\n')
    for (const owner of owners) {
      const email = (owner as Membership & { User?: User }).User?.email
      if (email) await queueMail(null, { kind: 'project-finished', to: email, subject: `Finished: ${project.name}`, text, studioId: project.studioId })
    }
  }
  catch (error) {
    console.error('Could not send the finished-project mail', error)
  }
}
