import { execFileSync, spawnSync } from 'node:child_process'
import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { demoDesign } from '../../shared/demo/designs'
import { electricalSheetsPdf } from '../../server/render'

const hasPdftoppm = spawnSync('pdftoppm', ['-v']).error === undefined
const dir = mkdtempSync(path.join(os.tmpdir(), 'stringline-png-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

describe.skipIf(!hasPdftoppm)('E-601 rendered to PNG by pdftoppm (poppler-utils)', () => {
  it('rasterises at print size: 11 × 17 in at 100 dpi, with ink on it', async () => {
    const pdf = await electricalSheetsPdf(demoDesign('gridTiedStorage'), { preparedBy: 'R. Quill' })
    writeFileSync(path.join(dir, 'sheets.pdf'), pdf)
    execFileSync('pdftoppm', ['-r', '100', '-f', '1', '-l', '1', '-gray', '-png', path.join(dir, 'sheets.pdf'), path.join(dir, 'page')])
    const file = readdirSync(dir).find((f) => f.endsWith('.png'))!
    const png = readFileSync(path.join(dir, file))
    expect(png.subarray(1, 4).toString('ascii')).toBe('PNG')
    // IHDR: width and height, big-endian, at bytes 16 and 20
    expect(png.readUInt32BE(16)).toBe(1700)
    expect(png.readUInt32BE(20)).toBe(1100)
    // a blank page compresses to almost nothing; a drawn sheet does not
    expect(png.length).toBeGreaterThan(40_000)
  })
})

if (!hasPdftoppm) console.warn('render-png: pdftoppm not found; install poppler-utils to run the PNG check')
