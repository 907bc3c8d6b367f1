/**
 * A throwaway npm registry on the loopback interface that serves the packed tarballs, so npm
 * installs `@bridgework/*` by name exactly as it would after publishing, while every other package
 * comes from the user's configured registry (npm is pointed at this one for the `@bridgework`
 * scope only). It answers the three requests npm makes: a package document, a tarball, and
 * `whoami` (for `npm publish --dry-run`). Nothing is cached outside the caller's temp folder.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { basename } from 'node:path';

/** One packed package the registry serves. */
export interface PackedPackage {
  /** Package name. */
  readonly name: string;
  /** Version. */
  readonly version: string;
  /** Path of the .tgz. */
  readonly file: string;
  /** The package.json inside the tarball. */
  readonly manifest: Record<string, unknown>;
}

/** A running local registry. */
export interface LocalRegistry {
  /** Base URL, ending in '/'. */
  readonly url: string;
  /** npm command-line settings that route the `@bridgework` scope here (with a token for whoami). */
  readonly npmArgs: readonly string[];
  /** Stops the server. */
  close(): Promise<void>;
}

/**
 * Starts the registry on 127.0.0.1 (a free port).
 *
 * @param packages - The tarballs to serve; several versions of one name are allowed.
 * @returns The running registry.
 */
export async function startLocalRegistry(packages: readonly PackedPackage[]): Promise<LocalRegistry> {
  const tarballs = new Map(packages.map((p) => [basename(p.file), p.file]));
  let base = '';
  const packument = (name: string): object | undefined => {
    const versions = packages.filter((p) => p.name === name);
    if (versions.length === 0) return undefined;
    const entries = versions.map((p) => {
      const data = readFileSync(p.file);
      const integrity = `sha512-${createHash('sha512').update(data).digest('base64')}`;
      const shasum = createHash('sha1').update(data).digest('hex');
      const dist = { tarball: `${base}-/${basename(p.file)}`, integrity, shasum };
      return [p.version, { ...p.manifest, _id: `${p.name}@${p.version}`, dist }] as const;
    });
    const latest = entries.map(([v]) => v).sort((a, b) => compareVersions(a, b))[entries.length - 1]!;
    return { _id: name, name, 'dist-tags': { latest }, versions: Object.fromEntries(entries) };
  };

  const server: Server = createServer((req, res) => {
    const path = decodeURIComponent((req.url ?? '/').split('?')[0]!);
    const send = (status: number, body: object | Buffer): void => {
      const data = Buffer.isBuffer(body) ? body : Buffer.from(JSON.stringify(body));
      res.writeHead(status, {
        'content-type': Buffer.isBuffer(body) ? 'application/octet-stream' : 'application/json',
        'content-length': data.length,
      });
      res.end(data);
    };
    if (path === '/-/whoami') return send(200, { username: 'consumer-test' });
    if (path.startsWith('/-/')) {
      const file = tarballs.get(path.slice(3));
      return file === undefined ? send(404, { error: 'not found' }) : send(200, readFileSync(file));
    }
    const doc = packument(path.slice(1));
    return doc === undefined ? send(404, { error: 'not found' }) : send(200, doc);
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const address = server.address();
  if (address === null || typeof address === 'string') throw new Error('the registry has no port');
  base = `http://127.0.0.1:${address.port}/`;
  return {
    url: base,
    npmArgs: [`--@bridgework:registry=${base}`, `--//127.0.0.1:${address.port}/:_authToken=consumer-test`],
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections(); // npm keeps its sockets alive
      }),
  };
}

function compareVersions(a: string, b: string): number {
  const pa = a.split(/[.-]/).map(Number);
  const pb = b.split(/[.-]/).map(Number);
  for (let i = 0; i < 3; i++) if (pa[i] !== pb[i]) return (pa[i] ?? 0) - (pb[i] ?? 0);
  return 0;
}
