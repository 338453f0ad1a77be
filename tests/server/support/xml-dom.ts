import { createRequire } from 'node:module'
import { expect } from 'vitest'

/** The part of the XML DOM the checks use (the server build has no DOM types, jsdom ships none). */
export interface XmlElement { getAttribute(name: string): string | null; textContent: string | null }
export interface XmlDocument {
  documentElement: XmlElement
  getElementsByTagName(name: string): ArrayLike<XmlElement> & Iterable<XmlElement>
  querySelectorAll(selector: string): ArrayLike<XmlElement> & Iterable<XmlElement>
}
type Jsdom = { JSDOM: new (html: string) => { window: { DOMParser: new () => { parseFromString(text: string, type: string): XmlDocument } } } }
const { JSDOM } = createRequire(import.meta.url)('jsdom') as Jsdom

/** A strict XML parse: a malformed document gives a parsererror element, which fails the test. */
export const parseSvg = (svg: string): XmlDocument => {
  const doc = new new JSDOM('').window.DOMParser().parseFromString(svg, 'image/svg+xml')
  expect(doc.getElementsByTagName('parsererror')).toHaveLength(0)
  return doc
}
