// Custom-elements manifest for @tauline/elements (`npm run cem`, also part of `npm run build`).
// Run from the repository root; the header JSDoc of each element (@fires, @csspart,
// @cssproperty, @summary) and the static `properties` feed the manifest.
export default {
  globs: ['packages/elements/src/**/*.ts'],
  exclude: ['packages/elements/src/**/*.styles.ts'],
  outdir: 'packages/elements',
  litelement: true,
  dev: false,
};
