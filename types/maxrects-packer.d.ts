// The ESM build of maxrects-packer ships without its own declaration beside it; it re-exports the
// package's typed API.
declare module 'maxrects-packer/dist/maxrects-packer.mjs' {
  export * from 'maxrects-packer';
}
