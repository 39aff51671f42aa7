// The same declaration as server/types/fontkit.d.ts, for bench/cards.bench.ts, which the app's
// tsconfig checks (server/ is outside it): the part of fontkit 2 that server/cards/fontCache.ts uses.
declare module 'fontkit' {
  export function create(buffer: Buffer | Uint8Array, postscriptName?: string): object
}
