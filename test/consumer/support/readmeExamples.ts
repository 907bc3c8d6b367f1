/**
 * The runnable example of a package README: the section `## Example` holds the program (a ```js
 * block, or ```sh command lines for the CLI), any files it reads (blocks whose info string names
 * them, ```yaml file=gauge.yaml) and its output (a ```text block). test/packaging.test.ts checks
 * that every README has one; test/consumer/consumer.test.ts runs it against the installed tarballs
 * and compares the output.
 */

/** What the `## Example` section of a README holds. */
export interface ReadmeExample {
  /** The example program (JavaScript that is also valid TypeScript), or '' when there is none. */
  readonly code: string;
  /** Files the example reads, by name. */
  readonly files: readonly { readonly name: string; readonly text: string }[];
  /** Command lines of the first ```sh block (the CLI README). */
  readonly commands: readonly string[];
  /** The expected standard output, without its final newline. */
  readonly output: string;
}

/**
 * Reads the example of a README.
 *
 * @param readme - The README text.
 * @returns The example.
 * @throws Error when the section or its output block is missing.
 */
export function readmeExample(readme: string): ReadmeExample {
  const section = /^## Example\n([\s\S]*?)(?=^## |(?![\s\S]))/m.exec(readme)?.[1];
  if (section === undefined) throw new Error('the README has no "## Example" section');
  const blocks = [...section.matchAll(/^```([^\n]*)\n([\s\S]*?)^```$/gm)].map((m) => ({
    info: m[1]!.trim().split(/\s+/),
    text: m[2]!,
  }));
  const first = (lang: string): string | undefined =>
    blocks.find((b) => b.info[0] === lang && b.info.length === 1)?.text;
  const output = first('text');
  if (output === undefined) throw new Error('the README example has no ```text output block');
  const files = blocks.flatMap((b) => {
    const name = b.info.find((w) => w.startsWith('file='))?.slice('file='.length);
    return name === undefined ? [] : [{ name, text: b.text }];
  });
  return {
    code: first('js') ?? '',
    files,
    commands: (first('sh') ?? '')
      .split('\n')
      .map((line) => line.trim())
      .filter((line) => line !== '' && !line.startsWith('#')),
    output: output.replace(/\n$/, ''),
  };
}

/**
 * The same program as CommonJS: each `import { a, b } from 'x';` becomes
 * `const { a, b } = require('x');`.
 *
 * @param code - An ES module whose imports are all named imports.
 * @returns The CommonJS program.
 * @throws Error for any other import form.
 */
export function toCommonJs(code: string): string {
  const converted = code.replace(
    /^import \{([^}]*)\} from '([^']+)';$/gm,
    (_, names: string, from: string) =>
      `const {${names.replace(/\b(\w+) as (\w+)\b/g, '$1: $2')}} = require('${from}');`,
  );
  if (/^import\b/m.test(converted)) throw new Error(`an import form toCommonJs does not handle:\n${code}`);
  return converted;
}
