// The part of fontkit 2 that server/cards/fontCache.ts uses (the package ships no types).
declare module 'fontkit' {
  export function create(buffer: Buffer | Uint8Array, postscriptName?: string): object
}
