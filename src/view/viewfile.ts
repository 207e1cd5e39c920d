// midrail's own saved-view format: which nets are shown and how, the cursors and the time
// window. Versioned JSON; every field is checked on load and a bad file gets a message that
// names the field. Times are stored in seconds so a view also fits a re-run with another
// timescale. Pure: no DOM.

import { parseLevel } from '../measure/level';
import { RADIXES, type Radix } from '../render/radix';
import type { ThemeName } from '../render/theme';
import { type MeasurePart, readMeasurePart } from './measure/viewpart';

export const VIEW_FORMAT = 'midrail-view';
export const VIEW_VERSION = 1;

export interface ViewLane {
  net: string;
  /** One bit of a vector shown on its own, in the net's declared numbering. */
  bit?: number;
  label?: string;
  radix?: Radix;
  /** Palette index or '#rrggbb'. */
  color?: number | string;
  /** Bits shown beneath the net. */
  expanded?: boolean;
  /** Real nets: fixed plot range (omitted = fitted to the data). */
  lo?: number;
  hi?: number;
  /** Real nets: reference level as `midrail delay --level` takes it ('30%', '1.2V'); omitted = 50 %. */
  level?: string;
}

export interface ViewGroup {
  group: string;
  collapsed?: boolean;
  lanes: ViewLane[];
}

export interface ViewCursor {
  name: string;
  /** Seconds from time 0. */
  time: number;
}

export interface ViewFile {
  format: typeof VIEW_FORMAT;
  version: typeof VIEW_VERSION;
  /** File name of the dump the view was made on (informational; a view fits any dump). */
  dump: string;
  /** Shown time window, seconds. */
  window: { start: number; end: number };
  cursors: ViewCursor[];
  activeCursor: number;
  referenceCursor: number;
  lanes: Array<ViewLane | ViewGroup>;
  theme?: ThemeName;
  /** Measurements (as a measurement plan), the glitch width and the worst-case sheet. */
  measure?: MeasurePart;
}

export class ViewFileError extends Error {}

type Obj = Record<string, unknown>;

function fail(where: string, problem: string): never {
  throw new ViewFileError(`view file: ${where} ${problem}`);
}

function isObj(v: unknown): v is Obj {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function num(o: Obj, key: string, where: string, optional: boolean): number | undefined {
  const v = o[key];
  if (v === undefined && optional) return undefined;
  if (typeof v !== 'number' || !Number.isFinite(v)) fail(`${where}.${key}`, `must be a finite number, got ${JSON.stringify(v) ?? 'nothing'}`);
  return v;
}

function str(o: Obj, key: string, where: string, optional: boolean, maxLen = 4096): string | undefined {
  const v = o[key];
  if (v === undefined && optional) return undefined;
  if (typeof v !== 'string') fail(`${where}.${key}`, `must be text, got ${JSON.stringify(v) ?? 'nothing'}`);
  if (v.length > maxLen) fail(`${where}.${key}`, `is longer than ${maxLen} characters`);
  return v;
}

function bool(o: Obj, key: string, where: string): boolean | undefined {
  const v = o[key];
  if (v === undefined) return undefined;
  if (typeof v !== 'boolean') fail(`${where}.${key}`, `must be true or false, got ${JSON.stringify(v)}`);
  return v;
}

function onlyKeys(o: Obj, allowed: string[], where: string): void {
  for (const k of Object.keys(o)) if (!allowed.includes(k)) fail(where, `has an unknown field '${k}' (allowed: ${allowed.join(', ')})`);
}

function readLane(v: unknown, where: string): ViewLane {
  if (!isObj(v)) fail(where, 'must be an object with a "net" field');
  onlyKeys(v, ['net', 'bit', 'label', 'radix', 'color', 'expanded', 'lo', 'hi', 'level'], where);
  const lane: ViewLane = { net: str(v, 'net', where, false)! };
  if (lane.net.trim() === '') fail(`${where}.net`, 'is empty');
  const bit = num(v, 'bit', where, true);
  if (bit !== undefined) {
    if (!Number.isInteger(bit)) fail(`${where}.bit`, `must be a whole number, got ${bit}`);
    lane.bit = bit;
  }
  const label = str(v, 'label', where, true, 256);
  if (label !== undefined) lane.label = label;
  if (v.radix !== undefined) {
    if (typeof v.radix !== 'string' || !RADIXES.includes(v.radix as Radix)) {
      fail(`${where}.radix`, `is ${JSON.stringify(v.radix)}; expected one of ${RADIXES.join(', ')}`);
    }
    lane.radix = v.radix as Radix;
  }
  if (v.color !== undefined) {
    const c = v.color;
    if (!(typeof c === 'number' && Number.isInteger(c) && c >= 0 && c < 64) && !(typeof c === 'string' && /^#[0-9a-fA-F]{6}$/.test(c))) {
      fail(`${where}.color`, `is ${JSON.stringify(c)}; expected a palette number (0–63) or '#rrggbb'`);
    }
    lane.color = c;
  }
  const expanded = bool(v, 'expanded', where);
  if (expanded !== undefined) lane.expanded = expanded;
  for (const k of ['lo', 'hi'] as const) {
    const n = num(v, k, where, true);
    if (n !== undefined) lane[k] = n;
  }
  const level = str(v, 'level', where, true, 64);
  if (level !== undefined) {
    try {
      parseLevel(level);
    } catch (e) {
      fail(`${where}.level`, `is not a reference level: ${(e as Error).message}`);
    }
    lane.level = level;
  }
  if (lane.lo !== undefined && lane.hi !== undefined && !(lane.lo < lane.hi)) fail(where, `has lo ${lane.lo} not below hi ${lane.hi}`);
  return lane;
}

/** Checks a parsed JSON value; throws ViewFileError naming the first bad field. */
export function checkViewFile(v: unknown): ViewFile {
  if (!isObj(v)) fail('top level', 'must be a JSON object');
  if (v.format !== VIEW_FORMAT) fail('format', `is ${JSON.stringify(v.format) ?? 'missing'}; expected "${VIEW_FORMAT}" (is this a midrail view file?)`);
  if (typeof v.version !== 'number') fail('version', 'is missing');
  if (v.version > VIEW_VERSION) fail('version', `${v.version} is newer than this midrail reads (${VIEW_VERSION}); update midrail`);
  if (v.version !== VIEW_VERSION) fail('version', `${v.version} is not a known version (expected ${VIEW_VERSION})`);
  onlyKeys(v, ['format', 'version', 'dump', 'window', 'cursors', 'activeCursor', 'referenceCursor', 'lanes', 'theme', 'measure'], 'top level');
  const dump = str(v, 'dump', 'top level', false)!;
  if (!isObj(v.window)) fail('window', 'must be an object with start and end (seconds)');
  onlyKeys(v.window, ['start', 'end'], 'window');
  const start = num(v.window, 'start', 'window', false)!;
  const end = num(v.window, 'end', 'window', false)!;
  if (!(end > start)) fail('window', `end ${end} must be after start ${start}`);
  if (!Array.isArray(v.cursors)) fail('cursors', 'must be a list');
  if (v.cursors.length > 64) fail('cursors', 'has more than 64 cursors');
  const cursors = v.cursors.map((c, k) => {
    const where = `cursors[${k}]`;
    if (!isObj(c)) fail(where, 'must be an object with name and time');
    onlyKeys(c, ['name', 'time'], where);
    return { name: str(c, 'name', where, false, 64)!, time: num(c, 'time', where, false)! };
  });
  const idx = (key: 'activeCursor' | 'referenceCursor') => {
    const n = num(v, key, 'top level', false)!;
    if (!Number.isInteger(n) || n < 0 || (cursors.length > 0 && n >= cursors.length) || (cursors.length === 0 && n !== 0)) {
      fail(key, `is ${n}; expected a cursor number from 0 to ${Math.max(0, cursors.length - 1)}`);
    }
    return n;
  };
  const activeCursor = idx('activeCursor');
  const referenceCursor = idx('referenceCursor');
  if (!Array.isArray(v.lanes)) fail('lanes', 'must be a list');
  if (v.lanes.length > 100_000) fail('lanes', 'has more than 100000 entries');
  const lanes = v.lanes.map((item, k): ViewLane | ViewGroup => {
    const where = `lanes[${k}]`;
    if (isObj(item) && 'group' in item) {
      onlyKeys(item, ['group', 'collapsed', 'lanes'], where);
      const group = str(item, 'group', where, false, 256)!;
      const collapsed = bool(item, 'collapsed', where);
      if (!Array.isArray(item.lanes)) fail(`${where}.lanes`, 'must be a list');
      const inner = item.lanes.map((l, j) => readLane(l, `${where}.lanes[${j}]`));
      return collapsed === undefined ? { group, lanes: inner } : { group, collapsed, lanes: inner };
    }
    return readLane(item, where);
  });
  let theme: ThemeName | undefined;
  if (v.theme !== undefined) {
    if (v.theme !== 'paper' && v.theme !== 'slate') fail('theme', `is ${JSON.stringify(v.theme)}; expected "paper" or "slate"`);
    theme = v.theme;
  }
  const out: ViewFile = { format: VIEW_FORMAT, version: VIEW_VERSION, dump, window: { start, end }, cursors, activeCursor, referenceCursor, lanes };
  if (theme) out.theme = theme;
  if (v.measure !== undefined) {
    const m = readMeasurePart(v.measure);
    if ('problem' in m) throw new ViewFileError(`view file: ${m.problem}`);
    out.measure = m.part;
  }
  return out;
}

/** Parses and checks view-file text. */
export function readViewFile(text: string): ViewFile {
  let v: unknown;
  try {
    v = JSON.parse(text);
  } catch (e) {
    throw new ViewFileError(`view file: not valid JSON (${(e as Error).message})`);
  }
  return checkViewFile(v);
}

export function writeViewFile(view: ViewFile): string {
  return JSON.stringify(view, null, 2) + '\n';
}
