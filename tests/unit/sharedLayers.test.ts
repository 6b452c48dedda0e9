import { join, relative } from 'node:path'
import { describe, expect, it } from 'vitest'
import { importsOf, root, sourceFiles } from '../support/sourceImports'

// shared/ is cut by who uses it, and each layer imports only the layers below it
// (DEVELOPERS.md, "Where does a new thing go"). Type imports count: a type file that imports
// upward ties the layers together as much as a value import does.
const below: Record<string, string[]> = {
  engine: [],
  text: [],
  piece: ['engine', 'text'],
  types: ['engine', 'text', 'piece'],
  motif: ['engine', 'text', 'types'],
  validation: ['engine', 'text', 'piece', 'types', 'motif'],
  planner: ['engine', 'text', 'piece', 'types', 'motif', 'validation'],
  // The engine's public entry for outside checks (issue #3): nothing but the engine.
  knitting: ['engine'],
}

const layerOf = (file: string) => relative(join(root, 'shared'), file).split('/')[0]!

describe('shared/ layers', () => {
  const sharedFiles = sourceFiles(join(root, 'shared'))

  it('knows every folder of shared/', () => {
    expect([...new Set(sharedFiles.map(layerOf))].sort()).toEqual(Object.keys(below).sort())
  })

  it('imports only from its own layer and the layers below it', () => {
    const upward: string[] = []
    for (const file of sharedFiles) {
      const layer = layerOf(file)
      for (const { spec, file: target } of importsOf(file, true)) {
        if (!target) continue
        const to = relative(root, target).startsWith('shared/') ? layerOf(target) : 'outside shared/'
        if (to !== layer && !below[layer]!.includes(to)) upward.push(`${relative(root, file)} → ${spec}`)
      }
    }
    expect(upward).toEqual([])
  })

  it('keeps the engine loadable without the #shared alias (outside checks import shared/knitting directly)', () => {
    const aliased = sharedFiles.filter(f => ['engine', 'knitting'].includes(layerOf(f)))
      .flatMap(f => importsOf(f, true).filter(i => i.spec.startsWith('#')).map(i => `${relative(root, f)} → ${i.spec}`))
    expect(aliased).toEqual([])
  })

  it('is imported by #shared/… paths, and the public entry shared/knitting only from outside the project', () => {
    const folders = [
      'pages',
      'components',
      'composables',
      'stores',
      'plugins',
      'layouts',
      'middleware',
      'server',
      'offline',
      'service-worker',
      'shared',
      'tests',
    ]
    const offenders: string[] = []
    for (const file of folders.flatMap(f => sourceFiles(join(root, f)))) {
      for (const { spec, file: target } of importsOf(file, true)) {
        if (!target || !relative(root, target).startsWith('shared/')) continue
        const sameLayer = relative(root, file).startsWith('shared/') && layerOf(file) === layerOf(target)
        if (layerOf(target) === 'knitting' && !relative(root, file).startsWith('shared/knitting/')) offenders.push(`${relative(root, file)} → ${spec}`)
        else if (!sameLayer && layerOf(file) !== 'knitting' && !spec.startsWith('#shared')) offenders.push(`${relative(root, file)} → ${spec}`)
      }
    }
    expect(offenders).toEqual([])
  })
})
