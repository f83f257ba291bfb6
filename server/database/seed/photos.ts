// Drawn photos for the demo team's marks: the base as it might look, so entry pages and search hits
// show a picture. Stored through the same checks and re-encoding as real uploads.
import { asc, eq } from 'drizzle-orm'
import * as schema from '../schema'
import { storePhoto } from '../../utils/photos'
import type { StorageDriver } from '../../utils/storage'
import type { DbOrTx } from '../../utils/db'
import { drawMarkPhoto, type DemoMarkShape } from './demo-photos'

const SHAPES: DemoMarkShape[] = ['round', 'oval', 'shield', 'banner']
const INKS = ['#1d3f8a', '#7a1f1f', '#2d5a3a', '#3a3a3a', '#6b3f1d']

/** Splits an inscription into the lines a stamp would carry (about 18 characters each, at most 4). */
export function stampLines(inscription: string): string[] {
  const words = inscription.split(/\s+/).filter(Boolean)
  const lines: string[] = []
  for (const word of words) {
    const last = lines.at(-1)
    if (last !== undefined && (last.length + word.length + 1) <= 18) lines[lines.length - 1] = `${last} ${word}`
    else lines.push(word)
  }
  return lines.slice(0, 4)
}

export async function seedDemoPhotos(db: DbOrTx, teamId: number, uploadedBy: number, storage: StorageDriver, limit = 80): Promise<number> {
  const marks = await db.select({ id: schema.marks.id }).from(schema.marks).where(eq(schema.marks.teamId, teamId)).orderBy(asc(schema.marks.id)).limit(limit)
  let stored = 0
  for (const { id } of marks) {
    const [first] = await db.select({ text: schema.markInscriptions.text }).from(schema.markInscriptions)
      .where(eq(schema.markInscriptions.markId, id)).orderBy(asc(schema.markInscriptions.position)).limit(1)
    if (!first) continue
    const bytes = await drawMarkPhoto(stampLines(first.text), { shape: SHAPES[id % SHAPES.length]!, colour: INKS[id % INKS.length]!, seed: id })
    await storePhoto({ teamId, uploadedBy, bytes, entityType: 'mark', entityId: id }, db, storage)
    stored++
  }
  return stored
}
