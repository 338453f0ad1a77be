import { ZipArchive } from 'archiver'

/** A zip of the entries in the order given, every entry dated `modified` (so a rebuild differs only where content does). */
export async function zipEntries(entries: readonly { name: string; bytes: Uint8Array }[], modified: Date): Promise<Buffer> {
  const archive = new ZipArchive({ zlib: { level: 6 } })
  const chunks: Buffer[] = []
  const done = new Promise<void>((resolve, reject) => {
    archive.on('data', (chunk: Buffer) => chunks.push(chunk))
    archive.on('end', () => resolve())
    archive.on('error', reject)
    archive.on('warning', reject)
  })
  for (const e of entries) archive.append(Buffer.from(e.bytes.buffer, e.bytes.byteOffset, e.bytes.byteLength), { name: e.name, date: modified })
  await archive.finalize()
  await done
  return Buffer.concat(chunks)
}
