import { summingNetworkRatio } from '@bridgework/calibration';
import { BridgeworkError, closestName, isBridgeworkError } from '@bridgework/core';
import type { ConvertedBlock, RecordingWriter } from '../data/convertRecording.js';
import type { ChannelColumn } from '../data/recordingColumns.js';
import type { LoadedGroup } from './loadGroups.js';

/** How `convert` writes the groups it is asked for. */
export interface GroupOutputPlan {
  /** The written columns: the kept channels, then each group's components. */
  readonly columns: readonly ChannelColumn[];
  /** The metadata entry describing the group columns (`bridgework.groups`). */
  readonly metadata: string;
  /**
   * Wraps the writer: each block's channel lanes (in the channels' own units) become the written
   * columns (kept channels multiplied by their display factors, then the components).
   */
  wrap(inner: RecordingWriter): RecordingWriter & {
    /** Samples per group component written as NaN so far (a bridge reading missing, or no convergence). */
    readonly flagged: ReadonlyMap<string, number>;
  };
}

/** Options of {@link planGroupOutput}. */
export interface GroupOutputOptions {
  /** The file's groups. */
  readonly groups: readonly LoadedGroup[];
  /** The `--groups` list (`all` or names). */
  readonly names: readonly string[];
  /** Drop the columns of the groups' bridges (write the components instead of them). */
  readonly dropBridges: boolean;
  /** The recording's channel columns, in lane order (units as written). */
  readonly channels: readonly ChannelColumn[];
  /** Per lane, the factor from the channel's unit to the written unit. */
  readonly factors: readonly number[];
  /** Frames per block (the lanes' stride). */
  readonly blockFrames: number;
}

/** A group column's quantity: the dimension of its unit. */
function quantityOf(group: LoadedGroup, c: number): string {
  return group.kind === 'platform'
    ? group.spec.indication.dimension
    : (group.spec.components[c]?.dimension as string);
}

/**
 * Plans `convert --groups`: which groups, which columns, and the writer that computes each
 * group's components from its bridges' converted values, block by block.
 *
 * @remarks
 * A multi-component group's components are the calibration's inverse of its bridges' readings
 * (the calibration package's `createInverse().convert`: direct for the linear model; the
 * fixed-point or Newton iteration of AIAA R-091 with its stated tolerance otherwise), in each
 * component's unit; a platform's indication is Σ k_i·r_i, or with an analog summing junction
 * k·(the junction's output solved through its network for the cells' own ratios, with the trims).
 * The readings are the channels' values
 * in their own units (what the group was calibrated in), before any display factor. A frame in
 * which a bridge's reading is flagged (NaN), or whose readings the model cannot explain (the
 * iteration does not converge), gives NaN components, counted per component. Nothing is allocated
 * per sample (but for the analog junction's network solve, which makes a few small arrays).
 *
 * @param options - Groups, names, whether to drop the bridges, the recording's columns.
 * @returns The plan.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an unknown group name, a
 *   group whose bridges are not all in the recording, or a file without groups.
 */
export function planGroupOutput(options: GroupOutputOptions): GroupOutputPlan {
  const { groups, channels, factors, blockFrames } = options;
  const known = groups.map((g) => g.spec.name);
  if (groups.length === 0) {
    throw new BridgeworkError('invalid-option', '--groups: the channel file has no groups section', {
      param: '--groups',
    });
  }
  const chosen =
    options.names.length === 1 && options.names[0] === 'all'
      ? [...groups]
      : options.names.map((name) => {
          const g = groups.find((x) => x.spec.name === name);
          if (g === undefined) {
            const near = closestName(name, known);
            throw new BridgeworkError(
              'invalid-option',
              `--groups: '${name}' is not a group of the channel file${near === undefined ? `; it has ${known.join(', ')}` : `; did you mean '${near}'?`}`,
              { param: '--groups', value: name },
            );
          }
          return g;
        });
  const names = channels.map((c) => c.name);
  const lanesOf = chosen.map((g) => {
    const missing = g.spec.bridges.filter((b) => !names.includes(b));
    if (missing.length > 0) {
      throw new BridgeworkError(
        'invalid-option',
        `--groups: group '${g.spec.name}' needs ${missing.join(', ')}, which ${missing.length === 1 ? 'is' : 'are'} not among the recording's channels (${names.join(', ')}); add ${missing.length === 1 ? 'it' : 'them'} to --channels`,
        { param: '--groups', value: g.spec.name },
      );
    }
    return g.spec.bridges.map((b) => names.indexOf(b));
  });
  const dropped = new Set(options.dropBridges ? lanesOf.flat() : []);
  const kept = channels.flatMap((_, j) => (dropped.has(j) ? [] : [j]));
  const groupColumns: ChannelColumn[] = chosen.flatMap((g) =>
    g.kind === 'platform'
      ? [
          {
            name: `${g.spec.name}.${g.spec.indication.name}`,
            unit: g.spec.indication.unit,
            quantity: quantityOf(g, 0),
          },
        ]
      : g.spec.components.map((c, j) => ({
          name: `${g.spec.name}.${c.name}`,
          unit: c.unit,
          quantity: quantityOf(g, j),
        })),
  );
  const columns = [...kept.map((j) => channels[j] as ChannelColumn), ...groupColumns];
  const metadata = JSON.stringify(
    chosen.map((g) =>
      g.kind === 'platform'
        ? {
            group: g.spec.name,
            kind: 'platform',
            bridges: g.spec.bridges,
            ...(g.summing === undefined
              ? { factors: g.factors.factors }
              : {
                  summing: 'analog',
                  trimsOhms: g.summing.trims.trimsOhms,
                  spanFactor: g.summing.spanFactor,
                }),
            column: `${g.spec.name}.${g.spec.indication.name}`,
          }
        : {
            group: g.spec.name,
            kind: 'multi-component',
            bridges: g.spec.bridges,
            ...(g.spec.calibration.form === 'schedule'
              ? { schedule: g.spec.calibration.schedule }
              : { storedCoefficients: true, source: g.spec.calibration.source ?? null }),
            terms: g.calibration.terms.map((t) => t.name),
            inverse: g.calibration.createInverse().method,
            columns: g.spec.components.map((c) => `${g.spec.name}.${c.name}`),
          },
    ),
  );

  return {
    columns,
    metadata,
    wrap(inner) {
      const stride = blockFrames;
      const out = new Float64Array(stride * columns.length);
      const rejected = new Array<number>(columns.length).fill(0);
      const flagged = new Map<string, number>(groupColumns.map((c) => [c.name, 0]));
      let inStride = stride;
      const solvers = chosen.map((g, gi) => {
        const lanes = lanesOf[gi] as number[];
        const nb = lanes.length;
        if (g.kind === 'platform' && g.summing !== undefined && g.spec.summing !== undefined) {
          // The analog junction's indication, W = k·(the junction's output for these cells' own
          // ratios), solved through the network (calibration summingNetworkRatio) per frame; a
          // frame with a cell at a rail (NaN) or beyond a bridge's ratio range gives NaN.
          const junction = g.spec.summing;
          const { spanFactor, ratioPerReading } = g.summing;
          const trimsOhms = g.summing.trims.trimsOhms;
          const ratios = new Array<number>(nb).fill(0);
          return (values: Float64Array, frames: number, target: number): void => {
            const base = target * stride;
            let bad = 0;
            for (let f = 0; f < frames; f++) {
              let ok = true;
              for (let i = 0; i < nb; i++) {
                const x =
                  (values[(lanes[i] as number) * inStride + f] as number) * (ratioPerReading[i] as number);
                if (!(Math.abs(x) < 0.5)) ok = false;
                ratios[i] = x;
              }
              const w = ok
                ? spanFactor *
                  summingNetworkRatio({
                    cellOhms: junction.cellOhms,
                    trimPlacement: junction.trimPlacement,
                    summingOhms: junction.summingOhms,
                    meterOhms: junction.meterOhms,
                    trimsOhms,
                    cellRatios: ratios,
                  })
                : NaN;
              out[base + f] = w;
              if (w !== w) bad++;
            }
            rejected[target] = bad;
            const key = columns[target]?.name as string;
            flagged.set(key, (flagged.get(key) as number) + bad);
          };
        }
        if (g.kind === 'platform') {
          const k = Float64Array.from(g.factors.factors);
          return (values: Float64Array, frames: number, target: number): void => {
            const base = target * stride;
            let bad = 0;
            for (let f = 0; f < frames; f++) {
              let s = 0;
              for (let i = 0; i < nb; i++)
                s += (k[i] as number) * (values[(lanes[i] as number) * inStride + f] as number);
              out[base + f] = s;
              if (s !== s) bad++;
            }
            rejected[target] = bad;
            const key = columns[target]?.name as string;
            flagged.set(key, (flagged.get(key) as number) + bad);
          };
        }
        const m = g.spec.components.length;
        const inverse = g.calibration.createInverse();
        const readings = new Float64Array(stride * nb);
        const loads = new Float64Array(stride * m);
        const frameOf = new Int32Array(stride);
        const one = new Float64Array(m);
        return (values: Float64Array, frames: number, target: number): void => {
          // Gather the frames whose readings are all valid, interleaved.
          let valid = 0;
          for (let f = 0; f < frames; f++) {
            let ok = true;
            for (let i = 0; i < nb; i++) {
              const r = values[(lanes[i] as number) * inStride + f] as number;
              if (r !== r) ok = false;
              readings[valid * nb + i] = r;
            }
            if (ok) frameOf[valid++] = f;
          }
          for (let j = 0; j < m; j++)
            out.fill(Number.NaN, (target + j) * stride, (target + j) * stride + frames);
          const solved = readings.subarray(0, valid * nb);
          let converged = true;
          try {
            inverse.convert(solved, loads);
          } catch (e) {
            if (!isBridgeworkError(e) || e.code !== 'not-converged') throw e;
            converged = false;
          }
          let unsolved = 0;
          for (let s = 0; s < valid; s++) {
            const f = frameOf[s] as number;
            let src: Float64Array = loads;
            let at = s * m;
            if (!converged) {
              try {
                inverse.loadsFromReadings(solved.subarray(s * nb, s * nb + nb), one);
                src = one;
                at = 0;
              } catch (e) {
                if (!isBridgeworkError(e) || e.code !== 'not-converged') throw e;
                unsolved++;
                continue;
              }
            }
            for (let j = 0; j < m; j++) out[(target + j) * stride + f] = src[at + j] as number;
          }
          const bad = frames - valid + unsolved;
          for (let j = 0; j < m; j++) {
            rejected[target + j] = bad;
            const key = columns[target + j]?.name as string;
            flagged.set(key, (flagged.get(key) as number) + bad);
          }
        };
      });
      const targets: number[] = [];
      let next = kept.length;
      for (const g of chosen) {
        targets.push(next);
        next += g.kind === 'platform' ? 1 : g.spec.components.length;
      }
      return {
        flagged,
        async writeBlock(block: ConvertedBlock): Promise<void> {
          const frames = block.frames;
          inStride = block.laneStride;
          kept.forEach((j, c) => {
            const factor = factors[j] as number;
            const from = j * block.laneStride;
            for (let f = 0; f < frames; f++)
              out[c * stride + f] = (block.values[from + f] as number) * factor;
            rejected[c] = block.rejected[j] as number;
          });
          solvers.forEach((solve, gi) => solve(block.values, frames, targets[gi] as number));
          await inner.writeBlock({ ...block, values: out, laneStride: stride, rejected });
        },
        finish: () => inner.finish(),
      };
    },
  };
}
