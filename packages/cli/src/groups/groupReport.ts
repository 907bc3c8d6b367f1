import { channelBudget } from '@bridgework/channel';
import type { MonteCarloResult } from '@bridgework/uncertainty';
import { formatNumber, formatPercent } from '../report/formatNumber.js';
import type { TableColumn } from '../terminal/formatTable.js';
import type { LoadedGroup, MultiComponentGroup, PlatformGroup } from './loadGroups.js';

/** A table of a group's report, as text cells (shared by the text and HTML reports). */
export interface GroupTable {
  /** What the table shows. */
  readonly caption: string;
  /** The columns. */
  readonly columns: readonly TableColumn[];
  /** The cells. */
  readonly rows: readonly (readonly string[])[];
}

/** One pass/fail finding of a group. */
export interface GroupCheck {
  /** What was checked. */
  readonly name: string;
  /** Whether it passed. */
  readonly ok: boolean;
  /** The figures behind the verdict. */
  readonly detail: string;
}

/** Residuals per component against the point of the schedule, for the HTML plot. */
export interface GroupResiduals {
  /** One series per component: its load residuals as a fraction of its full scale. */
  readonly series: readonly { readonly name: string; readonly fractions: readonly number[] }[];
}

/** What a report shows of one group. */
export interface GroupReport {
  /** The group's name. */
  readonly name: string;
  /** The section's title. */
  readonly title: string;
  /** Paragraphs: the group in words, the figures that are not tables. */
  readonly paragraphs: readonly string[];
  /** The tables. */
  readonly tables: readonly GroupTable[];
  /** The checks (the R 76 eccentricity test of a platform). */
  readonly checks: readonly GroupCheck[];
  /** The residuals per component (multi-component groups). */
  readonly residuals?: GroupResiduals;
  /** False when a check failed. */
  readonly ok: boolean;
  /** The same figures for `--json`, in the components' and bridges' own units. */
  readonly payload: Readonly<Record<string, unknown>>;
}

const right = (header: string): TableColumn => ({ header, align: 'right' });

/** Trials per component of the report's Monte Carlo runs (JCGM 101) at each load state. */
export const GROUP_MONTE_CARLO_TRIALS = 10_000;
/** The seed of those runs (the report is reproducible). */
export const GROUP_MONTE_CARLO_SEED = 1;
const n4 = (x: number): string => formatNumber(x, 4);

/** The standard uncertainty of each bridge's reading in use: its channel's total noise (rms), in the channel's unit. */
export function readingNoise(group: LoadedGroup): number[] {
  return group.bridges.map((b) => channelBudget(b.channel).noise.totalRms);
}

/** How the group's model came about, in words (fitted at load, or stored with its source). */
function modelSentence(g: MultiComponentGroup, secondOrder: number): string {
  const c = g.calibration;
  const terms =
    secondOrder > 0
      ? ` + ${secondOrder} second-order terms${g.fit === undefined ? '' : ` (${g.fit.spec.interactions})`}; AIAA R-091`
      : ' (linear)';
  if (g.fit !== undefined)
    return `Model r = a + S·F${terms}, fitted by least squares (Householder QR) to ${g.fit.points.length} points of ${g.fit.spec.schedule}; ${c.degreesOfFreedom} degrees of freedom; uncertainties of the coefficients from the residuals.`;
  const stored = g.spec.calibration.form === 'stored' ? g.spec.calibration : undefined;
  const source = stored?.source;
  const from =
    source === undefined
      ? 'no source stated'
      : [
          source.schedule === undefined
            ? undefined
            : `fitted to ${source.points === undefined ? '' : `${source.points} points of `}${source.schedule}${source.scheduleSha256 === undefined ? '' : ` (sha256 ${source.scheduleSha256.slice(0, 16)}…)`}`,
          source.date === undefined ? undefined : `on ${source.date}`,
          source.note,
        ]
          .filter((x) => x !== undefined)
          .join(' ');
  const covariance =
    c.uncertaintySource === 'stored'
      ? `with the fit's covariance stored (${Number.isFinite(c.degreesOfFreedom) ? `${c.degreesOfFreedom} degrees of freedom` : 'degrees of freedom not stated: taken as infinite'})`
      : "without a stored covariance: the uncertainties below hold the reading noise only, not the calibration's own uncertainty";
  return `Model r = a + S·F${terms}: stored coefficients (${from}), ${covariance}.`;
}

function multiComponentReport(g: MultiComponentGroup): GroupReport {
  const c = g.calibration;
  const fit = g.fit?.calibration;
  const comps = g.spec.components;
  const units = comps.map((x) => x.unit);
  const bridgeUnits = g.bridges.map((b) => b.unit);
  const sameBridgeUnit = bridgeUnits.every((u) => u === bridgeUnits[0]);
  const bu = sameBridgeUnit ? (bridgeUnits[0] as string) : 'bridge unit';
  const noise = readingNoise(g);
  const second = c.terms.filter((t) => t.kind === 'square' || t.kind === 'product');
  const inverse = c.createInverse();
  const zero = comps.map(() => 0);
  const atZero = c.uncertaintyAt({ loads: zero, readingStandardUncertainties: noise });
  const atFull = comps.map((_, j) =>
    c.uncertaintyAt({
      loads: comps.map((__, k) => (k === j ? (c.fullScale[j] as number) : 0)),
      readingStandardUncertainties: noise,
    }),
  );
  // The same states by Monte Carlo through the exact inverse (JCGM 101), the readings' noise and
  // the calibration's covariance as the GUM figures take them.
  const monteCarlo = (loads: readonly number[]) =>
    c.monteCarloAt({
      loads,
      readingStandardUncertainties: noise,
      trials: GROUP_MONTE_CARLO_TRIALS,
      seed: GROUP_MONTE_CARLO_SEED,
    });
  const mcZero = monteCarlo(zero);
  const mcFull = comps.map(
    (_, j) =>
      monteCarlo(comps.map((__, k) => (k === j ? (c.fullScale[j] as number) : 0)))[j] as MonteCarloResult,
  );
  const sampling = 1 / Math.sqrt(2 * GROUP_MONTE_CARLO_TRIALS);
  const paragraphs = [
    `${g.bridges.length} bridges (${g.spec.bridges.join(', ')}) → ${comps.length} components (${comps.map((x) => `${x.name} in ${x.unit}`).join(', ')}); readings are each bridge's converted value (${sameBridgeUnit ? bu : bridgeUnits.join(', ')}).`,
    modelSentence(g, second.length),
    fit === undefined
      ? `Condition of the full-scale-weighted sensitivity matrix (what the inverse amplifies): ${formatNumber(c.sensitivityCondition, 3)}.`
      : `Condition of the schedule (design matrix, unit-norm columns): ${formatNumber(fit.condition, 3)}; of the full-scale-weighted sensitivity matrix (what the inverse amplifies): ${formatNumber(c.sensitivityCondition, 3)}.`,
    ...(fit === undefined
      ? []
      : [
          fit.rejectedTerms.length === 0
            ? 'Every candidate term is determined by the schedule.'
            : `Terms the schedule cannot determine (left out): ${fit.rejectedTerms.map((r) => `${r.term.name} (${r.reason})`).join('; ')}.`,
        ]),
    `Inverse per sample: ${inverse.method === 'direct' ? 'direct, F = C·(r − a)' : `${inverse.method}, until every step is within ${formatNumber(inverse.tolerance, 2)} of full scale, at most ${inverse.maxIterations} steps`}.${fit === undefined ? '' : ` The reverse fit (loads regressed on readings) differs from C by at most ${formatPercent(fit.reverseFit.largestDifferenceFraction)} of a row's largest entry.`}`,
    `Reading noise in use, per bridge (its channel's total rms noise): ${g.bridges.map((b, i) => `${b.name} ${formatNumber(noise[i] as number, 3)} ${b.unit}`).join(', ')}.`,
  ];
  const sensitivity: GroupTable = {
    caption: `sensitivity S (${bu} per component unit): reading_i = a_i + Σ S_ij·F_j + …`,
    columns: [
      { header: 'bridge' },
      right(`offset a (${bu})`),
      ...comps.map((x) => right(`${x.name} (/${x.unit})`)),
    ],
    rows: c.sensitivity.map((row, i) => [
      g.spec.bridges[i] as string,
      n4(c.offsets[i] as number),
      ...row.map(n4),
    ]),
  };
  const crossTalk: GroupTable = {
    caption: "cross-talk: each bridge's output at a component's full scale, % of its full-scale output",
    columns: [{ header: 'bridge' }, { header: 'measures' }, ...comps.map((x) => right(x.name))],
    rows: c.crossTalk.map((row, i) => [
      g.spec.bridges[i] as string,
      comps[c.primaryComponents[i] as number]?.name as string,
      ...row.map((v) => formatPercent(v)),
    ]),
  };
  const loadMatrix: GroupTable = {
    caption: `load matrix C (component unit per ${bu}): F = C·(r − a)${second.length > 0 ? ', the start of the iteration' : ''}`,
    columns: [{ header: 'component' }, ...g.spec.bridges.map((b) => right(b))],
    rows: c.loadMatrix.map((row, j) => [`${comps[j]?.name} (${units[j]})`, ...row.map(n4)]),
  };
  const tables: GroupTable[] = [sensitivity, crossTalk, loadMatrix];
  if (second.length > 0) {
    tables.push({
      caption: "second-order terms: each term's output at full scale, % of each bridge's full-scale output",
      columns: [{ header: 'term' }, ...g.spec.bridges.map((b) => right(b))],
      rows: c.terms.flatMap((t, k) =>
        t.kind === 'square' || t.kind === 'product'
          ? [[t.name, ...c.termFractions.map((row) => formatPercent(row[k] as number))]]
          : [],
      ),
    });
  }
  tables.push({
    caption: `per component: standard uncertainty u (k = 1, JCGM 100: ${c.uncertaintySource === 'none' ? 'reading noise only, no calibration covariance stored' : 'calibration and reading noise'})${fit === undefined ? '' : ', residuals'}`,
    columns: [
      { header: 'component' },
      right('full scale'),
      right('u at zero'),
      right('u at full scale'),
      ...(fit === undefined
        ? []
        : [right('std error of fit'), right('largest residual'), right('hysteresis')]),
    ],
    rows: comps.map((x, j) => [
      `${x.name} (${x.unit})`,
      n4(c.fullScale[j] as number),
      formatNumber(atZero.standardUncertainties[j] as number, 3),
      formatNumber(atFull[j]?.standardUncertainties[j] as number, 3),
      ...(fit === undefined
        ? []
        : [
            fit.loadStandardErrors[j] === undefined
              ? '—'
              : formatNumber(fit.loadStandardErrors[j] as number, 3),
            `${formatPercent(fit.largestLoadResidualFractions[j] as number)} FS`,
            fit.hysteresisFractions[j] === undefined
              ? '—'
              : `${formatPercent(fit.hysteresisFractions[j] as number)} FS`,
          ]),
    ]),
  });
  tables.push({
    caption: `per component: Monte Carlo through the exact inverse (JCGM 101, ${GROUP_MONTE_CARLO_TRIALS} trials, seed ${GROUP_MONTE_CARLO_SEED}) beside the law of propagation (JCGM 100); a Monte Carlo u from ${GROUP_MONTE_CARLO_TRIALS} trials is itself uncertain by about ${formatPercent(sampling)}`,
    columns: [
      { header: 'component' },
      right('u at zero, GUM'),
      right('u at zero, MC'),
      right('MC/GUM'),
      right('95 % interval at zero, MC'),
      right('u at full scale, GUM'),
      right('u at full scale, MC'),
      right('MC/GUM'),
    ],
    rows: comps.map((x, j) => {
      const z = mcZero[j] as MonteCarloResult;
      const f = mcFull[j] as MonteCarloResult;
      const gz = atZero.standardUncertainties[j] as number;
      const gf = atFull[j]?.standardUncertainties[j] as number;
      return [
        `${x.name} (${x.unit})`,
        formatNumber(gz, 3),
        formatNumber(z.standardUncertainty, 3),
        formatNumber(z.standardUncertainty / gz, 3),
        `[${formatNumber(z.interval.min, 3)}, ${formatNumber(z.interval.max, 3)}]`,
        formatNumber(gf, 3),
        formatNumber(f.standardUncertainty, 3),
        formatNumber(f.standardUncertainty / gf, 3),
      ];
    }),
  });
  return {
    name: g.spec.name,
    title: `${g.spec.name}: ${comps.length}-component group`,
    paragraphs,
    tables,
    checks: [],
    ...(fit === undefined
      ? {}
      : {
          residuals: {
            series: comps.map((x, j) => ({
              name: x.name,
              fractions: fit.loadResiduals.map((r) => (r[j] as number) / (c.fullScale[j] as number)),
            })),
          },
        }),
    ok: true,
    payload: {
      kind: 'multi-component',
      bridges: g.spec.bridges,
      bridgeUnits,
      components: comps.map((x) => ({
        name: x.name,
        unit: x.unit,
        fullScale: c.fullScale[comps.indexOf(x)],
      })),
      calibration: g.fit === undefined ? 'stored' : 'schedule',
      ...(g.fit === undefined
        ? { source: g.spec.calibration.form === 'stored' ? (g.spec.calibration.source ?? null) : null }
        : { schedule: g.fit.spec.schedule, points: g.fit.points.length }),
      terms: c.terms.map((t) => t.name),
      ...(fit === undefined
        ? {}
        : { rejectedTerms: fit.rejectedTerms.map((r) => ({ term: r.term.name, reason: r.reason })) }),
      coefficients: c.coefficients,
      coefficientStandardUncertainties: c.coefficientStandardUncertainties ?? null,
      uncertaintySource: c.uncertaintySource,
      offsets: c.offsets,
      sensitivity: c.sensitivity,
      loadMatrix: c.loadMatrix,
      crossTalk: c.crossTalk,
      termFractions: c.termFractions,
      ...(fit === undefined ? {} : { condition: fit.condition }),
      sensitivityCondition: c.sensitivityCondition,
      degreesOfFreedom: Number.isFinite(c.degreesOfFreedom) ? c.degreesOfFreedom : null,
      readingStandardUncertainties: noise,
      standardUncertaintyAtZero: atZero.standardUncertainties,
      standardUncertaintyAtFullScale: atFull.map((u, j) => u.standardUncertainties[j]),
      ...(fit === undefined
        ? {}
        : {
            loadStandardErrors: fit.loadStandardErrors.map((v) => v ?? null),
            largestLoadResidualFractions: fit.largestLoadResidualFractions,
            hysteresisFractions: fit.hysteresisFractions.map((v) => v ?? null),
            loadResiduals: fit.loadResiduals,
          }),
      inverse: { method: inverse.method, tolerance: inverse.tolerance, maxIterations: inverse.maxIterations },
      monteCarlo: {
        trials: GROUP_MONTE_CARLO_TRIALS,
        seed: GROUP_MONTE_CARLO_SEED,
        coverage: mcZero[0]?.coverage,
        atZero: mcZero.map((r) => ({
          value: r.value,
          standardUncertainty: r.standardUncertainty,
          interval: [r.interval.min, r.interval.max],
        })),
        atFullScale: mcFull.map((r) => ({
          value: r.value,
          standardUncertainty: r.standardUncertainty,
          interval: [r.interval.min, r.interval.max],
        })),
      },
    },
  };
}

function platformReport(g: PlatformGroup): GroupReport {
  const e = g.spec.eccentricity;
  const unit = g.spec.indication.unit;
  const check = g.eccentricity.value;
  const cellUnits = g.bridges.map((b) => b.unit);
  // Errors below 1e-12 of the test load are rounding of the fit (numerical dust), shown as a bound.
  const dust = 1e-12 * e.testLoad;
  const s = g.summing;
  // The check positions in the order they were evaluated (file order).
  const checkNames = g.positions.filter((_, p) => g.fitted[p] !== true);
  const junction = g.spec.summing;
  const paragraphs = [
    s === undefined || junction === undefined
      ? `${g.bridges.length} load cells (${g.spec.bridges.join(', ')}) summed digitally: ${g.spec.indication.name} = Σ k_i·r_i in ${unit}, r_i each cell's converted value (${[...new Set(cellUnits)].join(', ')}).`
      : `${g.bridges.length} load cells (${g.spec.bridges.join(', ')}) summed in an analog junction: each cell's excitation through a trim resistor (${junction.trimPlacement === 'both-excitation' ? 'split between its +E and −E leads' : 'in its +E lead'}), the signals paralleled onto two buses${junction.summingOhms > 0 ? ` through ${formatNumber(junction.summingOhms, 4)} Ω each` : ''}, read by an indicator ${Number.isFinite(junction.meterOhms) ? `of ${formatNumber(junction.meterOhms, 4)} Ω input` : 'drawing no current'}; cells of ${[...new Set(junction.cellOhms.map((r) => formatNumber(r, 4)))].join(', ')} Ω. ${g.spec.indication.name} = k·(summed output), k = ${formatNumber(s.spanFactor / 1000, 7)} ${unit} per mV/V of supply.`,
    s === undefined
      ? `Factors k_i from the eccentricity test ${e.test} (${g.fitted.filter((f) => f).length} positions of ${formatNumber(e.testLoad, 4)} ${unit}, least squares; condition ${formatNumber(g.factors.condition, 3)})${e.checkPositions.length > 0 ? `; ${e.checkPositions.join(', ')} only checks them` : ''}.`
      : `Trims from the eccentricity test ${e.test} (${g.fitted.filter((f) => f).length} positions of ${formatNumber(e.testLoad, 4)} ${unit}), solved through the junction's network exactly (calibration fitSummingTrims, ${s.trims.iterations} Newton ${s.trims.iterations === 1 ? 'step' : 'steps'}): the corners read alike ${s.trims.positionSpreadFraction < 1e-12 ? 'to rounding (within 1e−12 of their mean)' : `within ${formatPercent(s.trims.positionSpreadFraction)} of their mean`}; ${g.spec.bridges[s.trims.referenceCell]} needs the most excitation and is left untrimmed${e.checkPositions.length > 0 ? `; ${e.checkPositions.join(', ')} only checks them` : ''}.`,
    ...(s === undefined || s.trims.checks.length === 0
      ? []
      : [
          `Remaining difference of the check positions from the corners' mean output: ${s.trims.checks.map((c, k) => `${checkNames[k] ?? `check ${k + 1}`} ${formatPercent(c.differenceFraction)}`).join(', ')}. This is the junction's second-order effect, not a trim error: each cell's input and output resistance changes as R(1 − x²) with load and one cell's imbalance drives currents through the others, so it shrinks about as the load squared.`,
        ]),
    `OIML R 76 eccentricity test, class ${e.accuracyClass}, Max ${formatNumber(e.maxCapacity, 4)} ${unit}, e = ${formatNumber(e.verificationInterval, 4)} ${unit}: mpe at the test load ${formatNumber(check.mpe, 3)} ${unit} (${formatNumber(check.mpeInIntervals, 2)} e); the test load R 76 asks for with ${e.supportPoints} supports is ${formatNumber(check.recommendedTestLoad, 4)} ${unit}; spread of the indications ${formatNumber(check.spread, 3)} ${unit}.`,
  ];
  const tables: GroupTable[] = [
    s === undefined
      ? {
          caption: `cell factors k (${unit} per reading unit)`,
          columns: [{ header: 'cell' }, right('factor k'), { header: 'per' }],
          rows: g.factors.factors.map((k, i) => [
            g.spec.bridges[i] as string,
            formatNumber(k, 7),
            cellUnits[i] as string,
          ]),
        }
      : {
          caption: `trim resistors of the summing junction (Ω), beside the digital factors the same test gives (${unit} per reading unit)`,
          columns: [
            { header: 'cell' },
            right('trim (Ω)'),
            { header: 'role' },
            right('digital factor'),
            { header: 'per' },
          ],
          rows: s.trims.trimsOhms.map((t, i) => [
            g.spec.bridges[i] as string,
            formatNumber(t, 5),
            i === s.trims.referenceCell ? 'reference' : 'trimmed',
            formatNumber(g.factors.factors[i] as number, 7),
            cellUnits[i] as string,
          ]),
        },
    {
      caption: `indication at each position with the ${s === undefined ? 'factors' : 'trims'} (${unit})`,
      columns: [
        { header: 'position' },
        { header: 'role' },
        right('indication'),
        right('error'),
        right('mpe'),
        right('of mpe'),
        { header: 'R 76' },
      ],
      rows: check.rows.map((r, p) => [
        g.positions[p] as string,
        g.fitted[p] === true ? 'fits' : 'checks',
        formatNumber(r.indication, 7),
        Math.abs(r.error) < dust ? `< ${formatNumber(dust, 1)}` : formatNumber(r.error, 3),
        formatNumber(r.mpe, 3),
        Math.abs(r.error) < dust ? `< ${formatPercent(dust / r.mpe)}` : formatPercent(r.fractionOfMpe),
        r.ok ? 'pass' : 'FAIL',
      ]),
    },
  ];
  const checks: GroupCheck[] = [
    {
      name: 'eccentricity (OIML R 76)',
      ok: g.eccentricity.ok,
      detail: g.eccentricity.ok
        ? `largest error ${formatPercent(check.largestFractionOfMpe)} of the mpe (${formatNumber(check.mpe, 3)} ${unit})`
        : g.eccentricity.issues.join(' '),
    },
  ];
  return {
    name: g.spec.name,
    title: `${g.spec.name}: ${g.bridges.length}-cell platform`,
    paragraphs,
    tables,
    checks,
    ok: g.eccentricity.ok,
    payload: {
      kind: 'platform',
      bridges: g.spec.bridges,
      bridgeUnits: cellUnits,
      indication: { name: g.spec.indication.name, unit },
      summing:
        s === undefined || junction === undefined
          ? null
          : {
              trimsOhms: s.trims.trimsOhms,
              referenceCell: g.spec.bridges[s.trims.referenceCell],
              trimPlacement: junction.trimPlacement,
              cellOhms: junction.cellOhms,
              summingOhms: junction.summingOhms,
              meterOhms: Number.isFinite(junction.meterOhms) ? junction.meterOhms : null,
              spanFactorPerVoltPerVolt: s.spanFactor,
              positionRatios: s.trims.positionRatios,
              positionSpreadFraction: s.trims.positionSpreadFraction,
              checks: s.trims.checks.map((c, k) => ({
                position: checkNames[k],
                ratio: c.ratio,
                differenceFraction: c.differenceFraction,
              })),
            },
      factors: g.factors.factors,
      condition: g.factors.condition,
      positions: g.positions.map((name, p) => ({
        name,
        role: g.fitted[p] === true ? 'fits' : 'checks',
        indication: check.rows[p]?.indication,
        error: check.rows[p]?.error,
        mpe: check.rows[p]?.mpe,
        ok: check.rows[p]?.ok,
      })),
      eccentricity: {
        ok: g.eccentricity.ok,
        issues: g.eccentricity.issues,
        accuracyClass: e.accuracyClass,
        mpe: check.mpe,
        recommendedTestLoad: check.recommendedTestLoad,
        largestFractionOfMpe: check.largestFractionOfMpe,
      },
    },
  };
}

/**
 * What the report shows of a group: for a multi-component group its sensitivity and load
 * matrices, cross-talk, second-order shares, conditions, and per component the standard
 * uncertainty at zero and at full scale (the fit's covariance and each bridge's reading noise
 * from its channel's budget, JCGM 100) with the fit's residuals; for a platform its cell factors,
 * each position's indication and the OIML R 76 eccentricity check. Every figure is the
 * calibration package's; this module only lays them out.
 *
 * @param group - The loaded group.
 * @returns The report's content.
 */
export function groupReport(group: LoadedGroup): GroupReport {
  return group.kind === 'platform' ? platformReport(group) : multiComponentReport(group);
}
