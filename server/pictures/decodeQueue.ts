// Who may have a picture read, and when: at most `slots` pictures at once on the whole server,
// one at a time per user, users taking turns, and a short line behind each. A full line is
// refused at once (QueueFullError), so waiting uploads cannot pile up in memory.

export interface DecodeQueueLimits {
  /** Pictures read at the same time (worker threads). */
  slots: number
  /** A user's uploads that may wait behind the one being read. */
  waitingPerUser: number
  /** Uploads that may wait, all users together. */
  waitingInAll: number
}

export class QueueFullError extends Error {
  constructor(readonly whose: 'user' | 'server') {
    super(whose === 'user' ? 'this user has too many pictures in the queue' : 'too many pictures are waiting')
  }
}

export function createDecodeQueue(limits: DecodeQueueLimits) {
  const lines = new Map<string, (() => void)[]>() // per user: uploads waiting, oldest first
  const turns: string[] = [] // users with an upload waiting and none being read, in the order they came
  const reading = new Set<string>()
  let waitingInAll = 0

  function startNext() {
    while (reading.size < limits.slots && turns.length) {
      const user = turns.shift()!
      const start = lines.get(user)!.shift()!
      waitingInAll--
      reading.add(user)
      start()
    }
  }

  function finished(user: string) {
    reading.delete(user)
    const line = lines.get(user)!
    if (line.length) turns.push(user) // behind everyone who waited meanwhile
    else lines.delete(user)
    startNext()
  }

  /** Runs `task` when it is `user`'s turn; throws QueueFullError when the line is full. */
  async function run<T>(user: string, task: () => Promise<T>): Promise<T> {
    const line = lines.get(user) ?? []
    if (line.length + (reading.has(user) ? 1 : 0) > limits.waitingPerUser) throw new QueueFullError('user')
    if (waitingInAll >= limits.waitingInAll) throw new QueueFullError('server')
    await new Promise<void>((start) => {
      lines.set(user, line)
      line.push(start)
      waitingInAll++
      if (!reading.has(user) && !turns.includes(user)) turns.push(user)
      startNext()
    })
    try {
      return await task()
    }
    finally {
      finished(user)
    }
  }

  return {
    run,
    /** How many uploads a user may have in the queue at once (read and waiting). */
    perUser: limits.waitingPerUser + 1,
    size: () => ({ reading: reading.size, waiting: waitingInAll }),
  }
}
