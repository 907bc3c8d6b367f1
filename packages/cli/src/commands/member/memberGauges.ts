/**
 * The `--gauges` and section options of `bridgework reduce-member`, read into the mechanics
 * package's `createMemberReduction` options.
 */
import type { MemberGauge, MemberResultant, Section } from '@bridgework/mechanics';
import { memberResultants } from '@bridgework/mechanics';
import { BridgeworkError } from '@bridgework/core';
import { parseNumberText } from '../../internal/csvText.js';
import { splitOptionList } from '../../internal/splitOptionList.js';
import { optionError, quantityOption } from '../recording/recordingTools.js';
import type { MemberArgs } from './memberOptions.js';

const DEG = Math.PI / 180;

/** One `--gauges` entry: its column as written, where it sits and its direction. */
export interface GaugeEntry {
  /** The column as the user named it. */
  readonly column: string;
  /** The entry as written (for messages). */
  readonly text: string;
  /** Position and direction on the section, SI. */
  readonly gauge: Required<MemberGauge>;
}

/** The section from the section options, with a description for the summary. */
export interface SectionChoice {
  readonly section: Section;
  /** Half the extent along y and z (where +y, −z… put a gauge), m. */
  readonly halfY: number;
  readonly halfZ: number;
  /** `'tube 88.9 × 76.3 mm'`-like words for the summary. */
  readonly text: string;
}

const length = (option: string, text: string): number => {
  if (!/[a-zµμ]/i.test(text)) {
    throw optionError(option, `'${text}' needs its unit, e.g. '${text} mm'`, text);
  }
  return quantityOption(option, text, 'm');
};

const mm = (m: number): string => `${Number((m * 1e3).toPrecision(6))}`;

/** The section of `--diameter`/`--bore` or `--width`/`--depth`/`--wall`. */
export function sectionChoice(o: MemberArgs['options']): SectionChoice {
  const round = o.diameter !== undefined || o.bore !== undefined;
  const rect = o.width !== undefined || o.depth !== undefined || o.wall !== undefined;
  if (round && rect) {
    throw new BridgeworkError(
      'conflicting-options',
      '--diameter/--bore (a round bar or tube) and --width/--depth/--wall (a rectangle) describe different sections: give one',
      { param: o.diameter !== undefined ? 'diameter' : 'bore' },
    );
  }
  if (round) {
    if (o.diameter === undefined) {
      throw new BridgeworkError('missing-option', '--bore needs --diameter (the outside diameter)', {
        param: 'diameter',
      });
    }
    const d = length('diameter', o.diameter);
    const bore = o.bore === undefined ? 0 : length('bore', o.bore);
    return {
      section: { shape: 'circular', diameterMeters: d, innerDiameterMeters: bore },
      halfY: d / 2,
      halfZ: d / 2,
      text: bore > 0 ? `tube ${mm(d)} × ${mm(bore)} mm bore` : `round bar ${mm(d)} mm`,
    };
  }
  if (rect) {
    if (o.width === undefined || o.depth === undefined) {
      throw new BridgeworkError(
        'missing-option',
        `--${o.width === undefined ? 'width' : 'depth'} is required for a rectangular section (--width along y, --depth along z)`,
        { param: o.width === undefined ? 'width' : 'depth' },
      );
    }
    const b = length('width', o.width);
    const h = length('depth', o.depth);
    const t = o.wall === undefined ? undefined : length('wall', o.wall);
    return {
      section: {
        shape: 'rectangular',
        widthMeters: b,
        depthMeters: h,
        ...(t === undefined ? {} : { wallThicknessMeters: t }),
      },
      halfY: b / 2,
      halfZ: h / 2,
      text:
        t === undefined
          ? `rectangle ${mm(b)} (y) × ${mm(h)} (z) mm`
          : `hollow rectangle ${mm(b)} (y) × ${mm(h)} (z) × ${mm(t)} mm wall`,
    };
  }
  throw new BridgeworkError(
    'missing-option',
    'the section is required: --diameter (and --bore) for a round bar or tube, or --width and --depth (and --wall) for a rectangle',
    { param: 'diameter' },
  );
}

/** Reads `--gauges` against the section. */
export function gaugeEntries(text: string, choice: SectionChoice): GaugeEntry[] {
  return splitOptionList(text, '--gauges').map((entry) => {
    const parts = entry.split('@').map((p) => p.trim());
    if (parts.length < 2 || parts.length > 3 || parts.some((p) => p === '')) {
      throw optionError(
        'gauges',
        `'${entry}' must be COLUMN@WHERE or COLUMN@WHERE@ANGLE, e.g. n@+z, t1@+y@45 or g3@0mm:30mm`,
        entry,
      );
    }
    const [column, where, angleText] = parts as [string, string, string | undefined];
    let y: number;
    let z: number;
    const axis = /^([+-])([yz])$/.exec(where);
    const around = /^(-?\d+(?:\.\d+)?)\s*(?:°|deg)$/.exec(where);
    if (axis !== null) {
      const sign = axis[1] === '-' ? -1 : 1;
      y = axis[2] === 'y' ? sign * choice.halfY : 0;
      z = axis[2] === 'z' ? sign * choice.halfZ : 0;
    } else if (around !== null) {
      if (choice.section.shape !== 'circular') {
        throw optionError(
          'gauges',
          `'${entry}': a place given as an angle around the section needs a round section; on a rectangle use +y, -y, +z, -z or Y:Z`,
          entry,
        );
      }
      const phi = Number(around[1]) * DEG;
      y = choice.halfY * Math.cos(phi);
      z = choice.halfZ * Math.sin(phi);
    } else if (where.includes(':')) {
      const [yt, zt] = where.split(':') as [string, string];
      y = length('gauges', yt.trim());
      z = length('gauges', zt.trim());
    } else {
      throw optionError(
        'gauges',
        `'${entry}': the place '${where}' must be +y, -y, +z, -z, an angle around a round section (90°) or Y:Z with units (0mm:30mm)`,
        entry,
      );
    }
    let angle = 0;
    if (angleText !== undefined) {
      const a = parseNumberText(angleText.replace(/°$/, ''));
      if (a === undefined || Math.abs(a) > 360) {
        throw optionError(
          'gauges',
          `'${entry}': the direction '${angleText}' must be degrees within ±360`,
          entry,
        );
      }
      angle = a * DEG;
    }
    return { column, text: entry, gauge: { yMeters: y, zMeters: z, angleRadians: angle } };
  });
}

/** `--resultants`, or undefined for the library's default. */
export function resultantsOption(text: string | undefined): MemberResultant[] | undefined {
  if (text === undefined) return undefined;
  return splitOptionList(text, '--resultants').map((r) => {
    if (!(memberResultants as readonly string[]).includes(r)) {
      throw optionError('resultants', `'${r}' is not a resultant: name ${memberResultants.join(', ')}`, r);
    }
    return r as MemberResultant;
  });
}
