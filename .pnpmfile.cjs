'use strict';
// Runs when pnpm packs or publishes a workspace package (pnpm pack, pnpm publish): the published
// package.json keeps no `scripts` (they name files under test/ that are not shipped, and a
// published library needs no lifecycle scripts) and no `devDependencies`.
module.exports = {
  hooks: {
    beforePacking(pkg) {
      delete pkg.scripts;
      delete pkg.devDependencies;
      return pkg;
    },
  },
};
