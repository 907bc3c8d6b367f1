/**
 * A file shipped in the `bridgework` package, by its path from the package's folder.
 *
 * @remarks
 * Found relative to this module, never to the working folder. This module lives two folders
 * below the package in every form the command runs in: `src/internal/` in a clone,
 * `dist/internal/` once built, and `dist/bundle/` inside the bundled executable.
 *
 * @param path - The path inside the package, e.g. `package.json` or `demo/footbridge-monitoring.yaml`.
 * @returns Its `file:` URL.
 */
export function packageFile(path: string): URL {
  return new URL(`../../${path}`, import.meta.url);
}
