import type { SpecIssue } from '@bridgework/core';
import {
  Composer,
  isAlias,
  isMap,
  isScalar,
  isSeq,
  LineCounter,
  Parser,
  YAMLParseError,
  type CST,
  type Document,
  type Node,
} from 'yaml';
import { channelFileLimits } from './channelFileLimits.js';
import {
  channelFileSource,
  numberLiteralIssue,
  parseError,
  positionOf,
  reservedKey,
  splitFieldPath,
  type ChannelDocument,
  type ChannelFileSyntax,
  type SourcePosition,
} from './channelFileText.js';
import { parseJsonChannelDocument } from './jsonChannelDocument.js';

export { reservedNames, splitFieldPath } from './channelFileText.js';
export type { ChannelDocument, ChannelFileSyntax, SourcePosition } from './channelFileText.js';

function firstLine(message: string): string {
  return (message.split('\n')[0] as string).replace(/ at line \d+, column \d+:?$/, '');
}

function locator(doc: Document, lines: LineCounter): (path: string) => SourcePosition | undefined {
  return (path) => {
    let node: unknown = doc.contents;
    let at: number | undefined;
    for (const key of splitFieldPath(path)) {
      if (isMap(node)) {
        const pair = node.items.find((p) => isScalar(p.key) && String(p.key.value) === String(key));
        if (pair === undefined) break;
        at = (pair.key as Node).range?.[0] ?? at;
        node = pair.value;
      } else if (isSeq(node) && typeof key === 'number') {
        const item = node.items[key] as Node | undefined;
        if (item === undefined) break;
        at = item.range?.[0] ?? at;
        node = item;
      } else {
        break;
      }
    }
    if (at === undefined) return undefined;
    const { line, col } = lines.linePos(at);
    return { line, column: col };
  };
}

/**
 * The offset of the first collection nested deeper than `limit` in YAML's concrete syntax tree,
 * found without recursion (the tree is built by yaml's iterative parser, so depth costs no stack
 * there; only building values from it would).
 */
function tooDeep(tokens: readonly CST.Token[], limit: number): number | undefined {
  for (const token of tokens) {
    const stack: [CST.Token | undefined, number][] = [[token, 0]];
    while (stack.length > 0) {
      const [t, depth] = stack.pop() as [CST.Token | undefined, number];
      if (t === undefined) continue;
      if (t.type === 'document') stack.push([t.value, depth]);
      else if (t.type === 'block-map' || t.type === 'block-seq' || t.type === 'flow-collection') {
        if (depth + 1 > limit) return t.offset;
        for (const item of t.items) {
          if ('key' in item && item.key !== undefined && item.key !== null) stack.push([item.key, depth + 1]);
          if ('value' in item && item.value !== undefined) stack.push([item.value, depth + 1]);
        }
      }
    }
  }
  return undefined;
}

interface Walk {
  readonly issues: SpecIssue[];
  readonly problems: { readonly offset: number; readonly message: string }[];
  readonly sizes: Map<Node, { nodes: number; depth: number }>;
  aliasNodes: number;
}

/**
 * Checks the composed YAML tree (at most `maxDepth` deep, so recursion is bounded): every alias
 * refers to an anchor before it and outside itself; the nodes that aliases copy, and the depth they
 * reach, stay within the limits; number literals fit a double. Returns the node count and depth of
 * `node` with aliases expanded.
 */
function walk(node: unknown, path: string, doc: Document, w: Walk): { nodes: number; depth: number } {
  if (isAlias(node)) {
    const offset = node.range?.[0] ?? 0;
    const target = node.resolve(doc);
    const size = target === undefined ? undefined : w.sizes.get(target as Node);
    if (target === undefined) {
      w.problems.push({
        offset,
        message: `the alias *${node.source} has no anchor &${node.source} before it`,
      });
      return { nodes: 1, depth: 0 };
    }
    if (size === undefined) {
      w.problems.push({ offset, message: `the alias *${node.source} refers to a node that contains it` });
      return { nodes: 1, depth: 0 };
    }
    w.aliasNodes += size.nodes;
    if (w.aliasNodes > channelFileLimits.maxAliasNodes) {
      w.problems.push({
        offset,
        message: `aliases copy more than ${channelFileLimits.maxAliasNodes} nodes in all; a channel file may share a block between channels, not multiply it`,
      });
      throw w; // stop walking: the count only grows from here
    }
    return size;
  }
  let nodes = 1;
  let depth = 0;
  if (isMap(node) || isSeq(node)) {
    node.items.forEach((item, i) => {
      const isPair = isMap(node);
      const pair = item as { key: unknown; value: unknown };
      const key = isPair ? (isScalar(pair.key) ? String(pair.key.value) : '?') : `[${i}]`;
      const child = isPair ? pair.value : item;
      const childPath = isPair ? (path === '' ? key : `${path}.${key}`) : `${path}${key}`;
      if (isPair) reservedKey(key, path, childPath, w.issues);
      if (isPair && !isScalar(pair.key)) {
        // A list, mapping or alias as a key: JavaScript objects have text keys only.
        w.problems.push({
          offset: (pair.key as Node | null)?.range?.[0] ?? node.range?.[0] ?? 0,
          message: 'a key must be a plain text (a name), not a list, a mapping or an alias',
        });
        throw w;
      }
      const s = walk(child, childPath, doc, w);
      nodes += s.nodes;
      depth = Math.max(depth, s.depth);
    });
    depth += 1;
    if (depth > channelFileLimits.maxDepth) {
      w.problems.push({
        offset: node.range?.[0] ?? 0,
        message: `nested more than ${channelFileLimits.maxDepth} levels deep (through aliases)`,
      });
      throw w;
    }
  } else if (isScalar(node) && typeof node.value === 'number') {
    const source = (node.source ?? '').trim();
    const issue = numberLiteralIssue(source === '' ? String(node.value) : source, node.value, path);
    if (issue !== undefined) w.issues.push(issue);
  }
  const size = { nodes, depth };
  if (node !== null && typeof node === 'object') w.sizes.set(node as Node, size);
  return size;
}

/**
 * The document of a syntax tree, as yaml's `parseDocument` composes it from the same tree (the
 * first document; a second one is the error `parseDocument` reports).
 */
function composeDocument(
  tokens: readonly CST.Token[],
  end: number,
  options: ConstructorParameters<typeof Composer>[0],
): Document.Parsed {
  let doc: Document.Parsed | undefined;
  for (const next of new Composer(options).compose(tokens, true, end)) {
    if (doc === undefined) doc = next;
    else if (doc.options.logLevel !== 'silent') {
      doc.errors.push(
        new YAMLParseError(
          [next.range[0], next.range[1]],
          'MULTIPLE_DOCS',
          'Source contains multiple documents; please use YAML.parseAllDocuments()',
        ),
      );
      break;
    }
  }
  return doc as Document.Parsed;
}

/**
 * Parses the text of a channel file (YAML 1.2 or JSON) with a map of field paths to positions.
 *
 * @remarks
 * YAML is read with the `yaml` package's core schema: no custom tags (an unknown tag such as
 * `!include` is an error, not a string), duplicate keys are errors, no merge keys, no dates.
 * Every syntax error is reported with its line and column, all at once:
 * `hopper.yaml:7:5: malformed YAML: Map keys must be unique`.
 *
 * The file must keep the limits of {@link channelFileLimits}: at most 1 MiB of text, 32 levels
 * of nesting (checked on the syntax tree before any value is built), and aliases that copy at
 * most 10 000 nodes in all; an alias must refer to an anchor written before it and outside
 * itself. Each is a `parse-error` with the position.
 *
 * JSON is checked against the strict JSON grammar first (RFC 8259: no comments, no trailing
 * commas, no NaN; the first error is named with its line and column), its values read by
 * `JSON.parse`, and the text scanned once more for duplicate keys, which `JSON.parse` would
 * silently drop, and to map field paths to positions (see {@link parseJsonChannelDocument}: JSON
 * is read without the YAML parser, so a JSON file never loads it).
 *
 * Values are returned as they are written; YAML's `.nan` and `.inf` become NaN and Infinity and
 * must be rejected by the schema where a finite number is needed. A number literal beyond the
 * range of a double (`1e400`), or a non-zero one that would be read as 0 (`1e-400`), is a
 * problem of its field: it is listed in `valueIssues` with the field's path. So is a key named
 * like a member of every JavaScript object (`constructor`, `toString`, `__proto__`...): no field
 * of a channel file has such a name, so it is an unknown field wherever it stands.
 *
 * @param text - The file's text.
 * @param file - The file name for messages.
 * @param syntax - `'yaml'` or `'json'`. Default: `'json'` for a `.json` name, else `'yaml'`.
 * @returns The parsed document.
 * @throws {@link @bridgework/core!BridgeworkError} `parse-error` listing every syntax error with its position,
 * or naming the limit that the file passes.
 * @example
 * ```ts
 * const doc = parseChannelDocument('channels:\n  hook:\n    excitation: { volts: 5 V }\n', 'hook.yaml');
 * doc.locate('channels.hook.excitation'); // { line: 3, column: 5 }
 * ```
 */
export function parseChannelDocument(
  text: string,
  file: string,
  syntax?: ChannelFileSyntax,
): ChannelDocument {
  const kind = syntax ?? (/\.json$/i.test(file) ? 'json' : 'yaml');
  if (kind === 'json') return parseJsonChannelDocument(text, file);
  const source = channelFileSource(text, file);
  // One pass of yaml's parser gives the syntax tree the depth is checked on and the document is
  // composed from (what parseDocument does, without parsing the text a second time).
  const lines = new LineCounter();
  const tokens = Array.from(new Parser(lines.addNewLine).parse(source));
  const deep = tooDeep(tokens, channelFileLimits.maxDepth);
  if (deep !== undefined) {
    const p = positionOf(source, deep);
    throw parseError(
      `${file}:${p.line}:${p.column}: malformed YAML: nested more than ${channelFileLimits.maxDepth} levels deep`,
      file,
    );
  }
  const doc = composeDocument(tokens, source.length, {
    lineCounter: lines,
    // Positions are computed from each error's offset below; the pretty context is not needed.
    prettyErrors: false,
    uniqueKeys: true,
    merge: false,
  });
  const at = (offset: number): string => {
    const { line, col } = lines.linePos(offset);
    return `${file}:${line}:${col}`;
  };
  const problems = [...doc.errors, ...doc.warnings];
  if (problems.length > 0) {
    throw parseError(
      problems.map((e) => `${at(e.pos[0])}: malformed YAML: ${firstLine(e.message)}`).join('\n'),
      file,
    );
  }
  const w: Walk = { issues: [], problems: [], sizes: new Map(), aliasNodes: 0 };
  try {
    walk(doc.contents, '', doc, w);
  } catch (e) {
    if (e !== w) throw e;
  }
  if (w.problems.length > 0) {
    throw parseError(w.problems.map((p) => `${at(p.offset)}: malformed YAML: ${p.message}`).join('\n'), file);
  }
  let data: unknown;
  try {
    data = doc.toJS({ maxAliasCount: channelFileLimits.maxAliasNodes });
  } catch (e) {
    // The walk above has checked every alias; this is the yaml package's own guard.
    throw parseError(`${file}: malformed YAML: ${(e as Error).message}`, file);
  }
  return { file, syntax: kind, data, valueIssues: w.issues, locate: locator(doc, lines) };
}
