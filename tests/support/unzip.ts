import yauzl from 'yauzl'

export interface ZipEntry { name: string; bytes: Buffer; modified: Date }

/** Every entry of a zip in central-directory order, read with yauzl (which refuses a malformed archive). */
export async function zipEntries(zip: Buffer): Promise<ZipEntry[]> {
  const file = await new Promise<yauzl.ZipFile>((resolve, reject) =>
    yauzl.fromBuffer(zip, { lazyEntries: true }, (err, opened) => (err ? reject(err) : resolve(opened))))
  return new Promise((resolve, reject) => {
    const entries: ZipEntry[] = []
    file.on('entry', (entry: yauzl.Entry) => {
      file.openReadStream(entry, (err, stream) => {
        if (err) return reject(err)
        const chunks: Buffer[] = []
        stream.on('data', (chunk: Buffer) => chunks.push(chunk))
        stream.on('error', reject)
        stream.on('end', () => {
          entries.push({ name: entry.fileName, bytes: Buffer.concat(chunks), modified: entry.getLastModDate() })
          file.readEntry()
        })
      })
    })
    file.on('end', () => resolve(entries))
    file.on('error', reject)
    file.readEntry()
  })
}

/** The entries of a zip by name. */
export async function unzip(zip: Buffer): Promise<Map<string, Buffer>> {
  return new Map((await zipEntries(zip)).map((e) => [e.name, e.bytes]))
}
