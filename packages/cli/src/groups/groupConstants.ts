import {
  FIRMWARE_CAUTION,
  cIdentifierFromName,
  matrixMap,
  type FloatPrecision,
  type MatrixMap,
} from '@bridgework/firmware';
import type { LoadedGroup, MultiComponentGroup } from './loadGroups.js';

/** Text as safe for a C comment: printable ASCII, no `*`, `\` or `?`. */
const commentSafe = (text: string): string =>
  text
    .replace(/²/g, '^2')
    .replace(/[·×]/g, '.')
    .replace(/−/g, '-')
    .replace(/[^\x20-\x7e]|[*\\?]/g, '_');
/** A number for a C comment: 4 significant digits, ASCII. */
const short = (x: number): string => String(Number(x.toPrecision(4)));

/** One group's firmware maps and what they state. */
export interface GroupConstants {
  /** The group's kind. */
  readonly kind: LoadedGroup['kind'];
  /** The group's name. */
  readonly name: string;
  /** The output names (components, or the platform's indication) with their units. */
  readonly outputs: readonly { readonly name: string; readonly unit: string }[];
  /** The inputs (bridges) with their units and the ranges the bounds hold over. */
  readonly inputs: readonly {
    readonly name: string;
    readonly unit: string;
    readonly min: number;
    readonly max: number;
  }[];
  /** The linear map (the load matrix C and offsets a, or the platform's factors) per precision. */
  readonly linear: Readonly<Partial<Record<FloatPrecision, MatrixMap>>>;
  /** For a model with second-order terms: D = C·Q per precision, over the terms g_t(F) with |F_j| ≤ full scale. */
  readonly interaction?: {
    /** The term names (`Fx·My`). */
    readonly terms: readonly string[];
    /** The two component indices of each term. */
    readonly componentIndices: readonly (readonly [number, number])[];
    /** The maps, per precision. */
    readonly maps: Readonly<Partial<Record<FloatPrecision, MatrixMap>>>;
  };
}

function interactionOf(
  g: MultiComponentGroup,
  precisions: readonly FloatPrecision[],
): GroupConstants['interaction'] {
  const c = g.calibration;
  const second = c.terms
    .map((t, index) => ({ t, index }))
    .filter(({ t }) => t.kind === 'square' || t.kind === 'product');
  if (second.length === 0) return undefined;
  // D = C·Q (M×T2): the fixed-point form F = C·(r − a) − D·g(F) of the inverse (AIAA R-091).
  const m = c.components.length;
  const d = Array.from({ length: m }, (_, j) =>
    second.map(({ index }) =>
      c.coefficients.reduce((s, row, i) => s + (c.loadMatrix[j]?.[i] as number) * (row[index] as number), 0),
    ),
  );
  const fs = c.fullScale;
  const ranges = second.map(({ t }) => {
    const [a, b] = t.components as [number, number];
    const p = (fs[a] as number) * (fs[b] as number);
    return a === b ? { min: 0, max: p } : { min: -p, max: p };
  });
  const maps: Partial<Record<FloatPrecision, MatrixMap>> = {};
  for (const precision of precisions)
    maps[precision] = matrixMap({ matrix: d, inputRanges: ranges, precision });
  return {
    terms: second.map(({ t }) => t.name),
    componentIndices: second.map(({ t }) => [t.components[0] as number, t.components[1] as number] as const),
    maps,
  };
}

/**
 * The firmware maps of a group: a multi-component group's load matrix C with its offsets
 * (F = C·(r − a), the linear inverse) and, with second-order terms, D = C·Q over the terms; a
 * platform's factors (W = Σ k_i·r_i). Each is a firmware `matrixMap` with its proved total error
 * bound in float32 and float64 over the bridges' spans (each channel's `span`).
 *
 * @param group - The loaded group.
 * @param precisions - The float precisions to make.
 * @returns The maps.
 */
export function groupConstants(group: LoadedGroup, precisions: readonly FloatPrecision[]): GroupConstants {
  const inputs = group.bridges.map((b) => ({
    name: b.name,
    unit: b.unit,
    min: b.channel.span.min,
    max: b.channel.span.max,
  }));
  const inputRanges = inputs.map((i) => ({ min: i.min, max: i.max }));
  const linear: Partial<Record<FloatPrecision, MatrixMap>> = {};
  if (group.kind === 'platform') {
    for (const precision of precisions)
      linear[precision] = matrixMap({ matrix: [group.factors.factors], inputRanges, precision });
    return {
      kind: 'platform',
      name: group.spec.name,
      outputs: [{ name: group.spec.indication.name, unit: group.spec.indication.unit }],
      inputs,
      linear,
    };
  }
  const c = group.calibration;
  for (const precision of precisions)
    linear[precision] = matrixMap({ matrix: c.loadMatrix, offsets: c.offsets, inputRanges, precision });
  const interaction = interactionOf(group, precisions);
  return {
    kind: 'multi-component',
    name: group.spec.name,
    outputs: group.spec.components.map((x) => ({ name: x.name, unit: x.unit })),
    inputs,
    linear,
    ...(interaction === undefined ? {} : { interaction }),
  };
}

/**
 * The groups' firmware maps as C99 source with its own include guard, to follow a channel file's
 * header: per group a comment stating the inputs (bridges, units, spans), the outputs, each
 * function's proved total error bound per output, and what is not bounded (the iteration of an
 * interaction model), then the functions of the firmware's `matrixMap`.
 *
 * @param groups - The groups' maps.
 * @param prefix - The C name prefix (`--prefix`).
 * @param source - The channel file and generator, for the first comment.
 * @returns The C text.
 */
export function groupsCSource(groups: readonly GroupConstants[], prefix: string, source: string): string {
  const p = cIdentifierFromName(prefix, 'prefix');
  const guard = `${p.toUpperCase()}_GROUPS_H`;
  const lines: string[] = [
    `/* Multi-bridge groups of ${commentSafe(source)}.`,
    ` * ${commentSafe(FIRMWARE_CAUTION)}`,
    ' */',
    `#ifndef ${guard}`,
    `#define ${guard}`,
    '',
  ];
  for (const g of groups) {
    const id = `${p}_${cIdentifierFromName(g.name)}`;
    const platform = g.kind === 'platform';
    lines.push(
      `/* Group ${commentSafe(g.name)}: inputs x[i] are the bridges ${commentSafe(g.inputs.map((i) => `${i.name} (${i.unit}, ${short(i.min)} to ${short(i.max)})`).join(', '))},`,
      ` * each its channel's converted value; outputs y[j] are ${commentSafe(g.outputs.map((o) => `${o.name} (${o.unit})`).join(', '))}.`,
      platform
        ? ' * y[0] = sum of factor[i] * x[i] (digital summing with the corner factors).'
        : ` * Linear inverse y = C (x - a)${g.interaction === undefined ? ', the calibration itself' : ': the start of the iteration below'}.`,
    );
    for (const [precision, map] of Object.entries(g.linear) as [FloatPrecision, MatrixMap][]) {
      lines.push(
        ` * ${precision}: proved total error against ${platform ? 'the sum with the fitted factors' : "the calibration's linear map"}, inputs within the spans: ${commentSafe(
          g.outputs
            .map((o, j) => `${o.name} ${(map.bounds[j] as number).toPrecision(3)} ${o.unit}`)
            .join(', '),
        )}.`,
      );
    }
    if (g.interaction !== undefined) {
      lines.push(
        ` * Second-order terms g_t(F) = F[a_t] F[b_t] (terms ${commentSafe(g.interaction.terms.join(', '))}) with D = C Q:`,
        ' * the loads solve F = C (x - a) - D g(F) (AIAA R-091), iterated F <- y - D g(F) from F = y.',
        ' * The D g products are bounded below for |F_j| within full scale; no bound is stated for the',
        " * iteration in C (its convergence and stopping rule are the caller's: compare with bridgework convert).",
      );
      for (const [precision, map] of Object.entries(g.interaction.maps) as [FloatPrecision, MatrixMap][]) {
        lines.push(
          ` * ${precision} D g: proved error per output ${map.bounds.map((b, j) => `${(b as number).toPrecision(3)} ${commentSafe(g.outputs[j]?.unit ?? '')}`).join(', ')}.`,
        );
      }
    }
    lines.push(' */');
    for (const map of Object.values(g.linear)) lines.push(map.cSource(p, g.name).trimEnd());
    if (g.interaction !== undefined) {
      const t = g.interaction.componentIndices;
      lines.push(
        `static const int ${id}_term_a[${t.length}] = { ${t.map((x) => x[0]).join(', ')} };`,
        `static const int ${id}_term_b[${t.length}] = { ${t.map((x) => x[1]).join(', ')} };`,
      );
      for (const map of Object.values(g.interaction.maps))
        lines.push(map.cSource(p, `${g.name}_interaction`).trimEnd());
    }
    lines.push('');
  }
  lines.push(`#endif /* ${guard} */`, '');
  return lines.join('\n');
}

/**
 * A constants text (C header or JSON of the channels) with the file's groups added: C source
 * after the header ({@link groupsCSource}), or a `groups` entry in the JSON holding each map's
 * constants and bounds. The groups get the float precisions among `types` (default both).
 *
 * @param text - The channels' constants text.
 * @param groups - The file's groups.
 * @param options - Format, prefix, types and a description of the source for the comment.
 * @returns The text with the groups.
 */
export function withGroups(
  text: string,
  groups: readonly LoadedGroup[],
  options: {
    readonly format: 'c' | 'json';
    readonly prefix: string;
    readonly types: readonly string[] | undefined;
    readonly source: string;
  },
): string {
  const precisions = (['float32', 'float64'] as const).filter(
    (p) => options.types === undefined || options.types.includes(p),
  );
  if (precisions.length === 0) return text;
  // A platform summed in an analog junction sums in hardware: its indicator reads one signal, so
  // there is no per-cell map to write (its span factor is in the report).
  const made = groups
    .filter((g) => g.kind !== 'platform' || g.summing === undefined)
    .map((g) => groupConstants(g, precisions));
  if (made.length === 0) return text;
  if (options.format === 'c')
    return `${text}${text.endsWith('\n') ? '' : '\n'}${groupsCSource(made, options.prefix, options.source)}`;
  const json = JSON.parse(text) as Record<string, unknown>;
  const plain = (map: MatrixMap) => ({
    precision: map.precision,
    matrix: map.matrix,
    offsets: map.offsets,
    bounds: map.bounds,
    boundParts: map.boundParts,
  });
  json['groups'] = made.map((g) => ({
    name: g.name,
    kind: g.kind,
    inputs: g.inputs,
    outputs: g.outputs,
    linear: Object.values(g.linear).map(plain),
    ...(g.interaction === undefined
      ? {}
      : {
          interaction: {
            terms: g.interaction.terms,
            componentIndices: g.interaction.componentIndices,
            maps: Object.values(g.interaction.maps).map(plain),
          },
        }),
  }));
  return `${JSON.stringify(json, null, 2)}\n`;
}
