import { describe, expect, it } from 'vitest'
import { demoDesign } from '@shared/demo/designs'
import { changesBySomeoneElse, countOwnChanges } from './designChanges'

describe('changes between design versions', () => {
  it('matches strings and runs by id, so removing one does not mark the later ones as changed', () => {
    const before = demoDesign('gridTied')
    const theirs = demoDesign('gridTied')
    theirs.topology.runs.splice(1, 1) // R2 removed
    theirs.topology.runs[2]!.lengthFt = 40 // R4, now third in the list

    const changes = changesBySomeoneElse(before, theirs, before)

    expect(changes.filter((c) => c.path.startsWith('topology.runs[R4]')).map((c) => [c.path, c.before, c.theirs])).toEqual([['topology.runs[R4].lengthFt', 15, 40]])
    expect(changes.filter((c) => c.path.startsWith('topology.runs[R3]'))).toEqual([])
    expect(changes.every((c) => c.path.startsWith('topology.runs[R2]') || c.path === 'topology.runs[R4].lengthFt')).toBe(true)
  })

  it('counts this editor’s own changes, and none for an untouched copy', () => {
    const before = demoDesign('gridTied')
    const mine = demoDesign('gridTied')
    expect(countOwnChanges(before, mine)).toBe(0)

    mine.codeBasis.designLowC = -22
    mine.topology.arrays[0]!.tiltDeg = 30
    expect(countOwnChanges(before, mine)).toBe(2)
  })
})
