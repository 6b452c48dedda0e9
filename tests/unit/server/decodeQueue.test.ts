import { describe, expect, it } from 'vitest'
import { createDecodeQueue, QueueFullError } from '../../../server/pictures/decodeQueue'

// The queue in front of the picture workers, with tasks the test finishes by hand.

function harness(limits = { slots: 2, waitingPerUser: 2, waitingInAll: 20 }) {
  const queue = createDecodeQueue(limits)
  const started: string[] = []
  const finishers = new Map<string, () => void>()
  const submit = (user: string, name: string) => queue.run(user, () => new Promise<string>((resolve) => {
    started.push(name)
    finishers.set(name, () => resolve(name))
  }))
  const finish = async (name: string) => {
    finishers.get(name)!()
    await new Promise(r => setImmediate(r)) // let the queue hand the slot on
  }
  return { queue, started, submit, finish }
}
const settle = () => new Promise(r => setImmediate(r))

describe('createDecodeQueue', () => {
  it('reads one picture at a time per user, others alongside up to the slots', async () => {
    const q = harness()
    const answers = [q.submit('a', 'a1'), q.submit('a', 'a2'), q.submit('b', 'b1'), q.submit('c', 'c1')]
    await settle()
    expect(q.started).toEqual(['a1', 'b1']) // a2 waits for a1 although a slot would be free for it
    await q.finish('a1')
    expect(q.started).toEqual(['a1', 'b1', 'c1']) // c came before a's second turn
    await q.finish('b1')
    expect(q.started).toEqual(['a1', 'b1', 'c1', 'a2'])
    await q.finish('c1')
    await q.finish('a2')
    expect(await Promise.all(answers)).toEqual(['a1', 'a2', 'b1', 'c1'])
    expect(q.queue.size()).toEqual({ reading: 0, waiting: 0 })
  })

  it('takes users in turns: a user with a line waits behind whoever came meanwhile', async () => {
    const q = harness({ slots: 1, waitingPerUser: 2, waitingInAll: 20 })
    void q.submit('a', 'a1'); void q.submit('a', 'a2'); void q.submit('a', 'a3')
    await settle()
    void q.submit('b', 'b1')
    await settle()
    await q.finish('a1')
    expect(q.started).toEqual(['a1', 'b1']) // not a2: b waited for a turn while a1 was read
    await q.finish('b1')
    await q.finish('a2')
    expect(q.started).toEqual(['a1', 'b1', 'a2', 'a3'])
  })

  it('refuses a user\'s upload beyond one being read and two waiting, and the server\'s beyond its line', async () => {
    const q = harness({ slots: 1, waitingPerUser: 2, waitingInAll: 3 })
    void q.submit('a', 'a1'); void q.submit('a', 'a2'); void q.submit('a', 'a3')
    await settle()
    await expect(q.submit('a', 'a4')).rejects.toEqual(new QueueFullError('user'))
    expect(q.queue.perUser).toBe(3)
    void q.submit('b', 'b1')
    await settle()
    await expect(q.submit('c', 'c1')).rejects.toEqual(new QueueFullError('server')) // a2, a3, b1 wait
    await q.finish('a1')
    void q.submit('a', 'a4') // b1 is read now; a has two waiting and none being read: room for a third
    await settle()
    expect(q.queue.size()).toEqual({ reading: 1, waiting: 3 })
  })

  it('a task that fails frees its slot and its place in the user\'s line', async () => {
    const queue = createDecodeQueue({ slots: 1, waitingPerUser: 0, waitingInAll: 20 })
    await expect(queue.run('a', () => Promise.reject(new Error('damaged')))).rejects.toThrow('damaged')
    expect(queue.size()).toEqual({ reading: 0, waiting: 0 })
    expect(await queue.run('a', () => Promise.resolve('next'))).toBe('next')
  })
})
