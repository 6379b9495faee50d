// The parsers the build writes (src/build/prebuilt-parsers.ts).
declare module 'virtual:capstan-prebuilt-parsers' {
  export const prebuiltParsers: import('./generated-parser').PrebuiltParsers;
}
