/** svgdom ships no types; the two functions we use. */
declare module 'svgdom' {
  export function createSVGWindow(): Window & typeof globalThis
  export function createSVGDocument(): Document
}
