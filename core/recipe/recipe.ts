/**
 * The recipe file: fill and slope settings plus hand edits of the dip field, saved by the desktop app and read
 * by `dipweave fill --recipe FILE`. Plain JSON, versioned; read strictly (unknown fields are errors, so a typo
 * never passes silently) with coded problems (input.bad-recipe) that name the field, the value found and what
 * was expected.
 *
 * {
 *   "format": "dipweave-recipe", "version": 1,
 *   "gatherKey": "record",            // optional: trace header key (name or BYTE[:2|:4])
 *   "spacingM": 12.5,                 // optional: grid spacing in metres
 *   "factor": 2,                      // optional: decimation factor to fill
 *   "fill":   { "solver": "lsq", "lsq": {...}, "net": {...}, "holdout": true, "secondPass": false },
 *   "slopes": { "method": "pwd", "radiusTimeSamples": 6, ... },   // core/slope SlopeOptions without edits
 *   "edits":  [ DipEdit, ... ],       // for every gather (core/slope/edits.ts)
 *   "gathers": { "1012": { "edits": [...], "badTraces": [3, 17] } }   // per gather key value
 * }
 */
import { InputFileError } from '../problems';
import type { LsqSettings } from '../fill/lsq';
import type { SolverName } from '../fill/solver';
import { validateDipEdits, type DipEdit, type SlopeOptions } from '../slope/index';

export const RECIPE_FORMAT = 'dipweave-recipe';
export const RECIPE_VERSION = 1;

export interface RecipeNetSettings {
  width?: number;
  depth?: number;
  steps?: number;
  lambda?: number | 'auto';
  seed?: number;
  timeBudgetSeconds?: number;
}

export interface RecipeFill {
  solver?: SolverName;
  lsq?: Partial<Pick<LsqSettings, 'order' | 'maxIterations' | 'tolerance' | 'plateau' | 'damping'>>;
  net?: RecipeNetSettings;
  holdout?: boolean;
  secondPass?: boolean;
  keepAmplitude?: boolean;
}

export type RecipeSlopes = Omit<SlopeOptions, 'edits'>;

export interface RecipeGather {
  edits?: DipEdit[];
  /** Grid positions (0-based, regular grid of the gather) to replace. */
  badTraces?: number[];
}

export interface Recipe {
  format: typeof RECIPE_FORMAT;
  version: number;
  gatherKey?: string;
  spacingM?: number;
  factor?: number;
  fill?: RecipeFill;
  slopes?: RecipeSlopes;
  edits?: DipEdit[];
  gathers?: Record<string, RecipeGather>;
}

function bad(file: string | undefined, field: string, message: string, found: unknown, expected: string): InputFileError {
  return new InputFileError({
    code: 'input.bad-recipe', severity: 'error', file, field, message,
    found: typeof found === 'string' ? found : JSON.stringify(found) ?? String(found), expected,
    hint: 'Save the recipe again from Dipweave, or fix the field (docs/fill.md, "Recipes").',
  });
}

type Check = (v: unknown) => string | null;
const isObj = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
const num = (lo: number, hi: number, integer = false): Check => (v) =>
  typeof v === 'number' && Number.isFinite(v) && v >= lo && v <= hi && (!integer || Number.isInteger(v)) ? null : `${integer ? 'a whole number' : 'a number'} from ${lo} to ${hi}`;
const oneOf = (...vals: readonly unknown[]): Check => (v) => (vals.includes(v) ? null : `one of ${vals.map((x) => JSON.stringify(x)).join(', ')}`);
const bool: Check = (v) => (typeof v === 'boolean' ? null : 'true or false');
const either = (a: Check, b: Check): Check => (v) => (a(v) === null || b(v) === null ? null : `${a(v)}, or ${b(v)}`);

function checkObject(file: string | undefined, path: string, v: unknown, fields: Record<string, Check>): void {
  if (!isObj(v)) throw bad(file, path, 'this field must be an object.', v, 'an object { … }');
  for (const [k, val] of Object.entries(v)) {
    const c = fields[k];
    if (!c) throw bad(file, `${path}.${k}`, 'unknown field.', k, `one of ${Object.keys(fields).join(', ')}`);
    const why = c(val);
    if (why) throw bad(file, `${path}.${k}`, 'value out of range.', val, why);
  }
}

const LSQ_FIELDS: Record<string, Check> = {
  order: oneOf(1, 2), maxIterations: num(0, 100_000, true), tolerance: num(0, 1), plateau: num(0, 1), damping: num(0, 10),
};
const NET_FIELDS: Record<string, Check> = {
  width: num(4, 256, true), depth: num(1, 6, true), steps: num(0, 1_000_000, true), lambda: either(oneOf('auto'), num(0, 1e12)),
  seed: num(-2147483648, 2147483647, true), timeBudgetSeconds: num(1e-3, 1e7),
};
const SLOPE_FIELDS: Record<string, Check> = {
  method: oneOf('pwd', 'tensor'), radiusTimeSamples: num(1, 1000), radiusTraces: num(1, 1000), order: oneOf(1, 2),
  outerIterations: num(1, 1000, true), innerIterations: num(1, 10_000, true), stepLimit: num(0.01, 100),
  decimationFactor: either(oneOf('auto'), num(1, 1000, true)), maxSlopeSamplesPerTrace: either(oneOf('auto'), num(0, 1000)),
  balance: bool, lowpassCyclesPerSample: either(oneOf('auto', 'off'), num(1e-4, 0.5)), propagateEdits: bool,
};

/** Validates parsed JSON as a recipe. Throws InputFileError input.bad-recipe (input.bad-dips for edits). */
export function validateRecipe(value: unknown, file?: string): Recipe {
  if (!isObj(value)) throw bad(file, '(top level)', 'a recipe is a JSON object.', value, `{ "format": "${RECIPE_FORMAT}", "version": ${RECIPE_VERSION}, … }`);
  if (value.format !== RECIPE_FORMAT) throw bad(file, 'format', 'this is not a Dipweave recipe.', value.format, `"${RECIPE_FORMAT}"`);
  if (typeof value.version !== 'number' || !Number.isInteger(value.version) || value.version < 1)
    throw bad(file, 'version', 'the recipe version is not a whole number ≥ 1.', value.version, String(RECIPE_VERSION));
  if (value.version > RECIPE_VERSION)
    throw bad(file, 'version', 'the recipe was written by a newer Dipweave.', value.version, `${RECIPE_VERSION} or lower`);
  const top: Record<string, Check> = {
    format: () => null, version: () => null,
    gatherKey: (v) => (typeof v === 'string' && v.trim() !== '' ? null : 'a key name or BYTE[:2|:4]'),
    spacingM: num(1e-9, 1e9), factor: num(1, 64, true),
    fill: () => null, slopes: () => null, edits: () => null, gathers: () => null,
  };
  checkObject(file, 'recipe', value, top);
  if (value.fill !== undefined) {
    checkObject(file, 'fill', value.fill, { solver: oneOf('lsq', 'net'), lsq: () => null, net: () => null, holdout: bool, secondPass: bool, keepAmplitude: bool });
    const f = value.fill as Record<string, unknown>;
    if (f.lsq !== undefined) checkObject(file, 'fill.lsq', f.lsq, LSQ_FIELDS);
    if (f.net !== undefined) checkObject(file, 'fill.net', f.net, NET_FIELDS);
  }
  if (value.slopes !== undefined) checkObject(file, 'slopes', value.slopes, SLOPE_FIELDS);
  if (value.edits !== undefined) validateDipEdits(value.edits);
  if (value.gathers !== undefined) {
    if (!isObj(value.gathers)) throw bad(file, 'gathers', 'this field must be an object keyed by gather key value.', value.gathers, '{ "1012": { … } }');
    for (const [k, g] of Object.entries(value.gathers)) {
      if (!/^-?\d+$/.test(k)) throw bad(file, `gathers.${k}`, 'a gather is named by its whole-number key value.', k, 'e.g. "1012"');
      checkObject(file, `gathers.${k}`, g, {
        edits: () => null,
        badTraces: (v) => (Array.isArray(v) && v.every((x) => Number.isInteger(x) && x >= 0) ? null : 'a list of grid positions (whole numbers ≥ 0)'),
      });
      const gg = g as RecipeGather;
      if (gg.edits !== undefined) validateDipEdits(gg.edits);
    }
  }
  return value as unknown as Recipe;
}

/** Parses recipe text (JSON) and validates it. */
export function parseRecipe(text: string, file?: string): Recipe {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (e) {
    throw bad(file, '(file)', 'the recipe is not valid JSON.', e instanceof Error ? e.message : String(e), 'a JSON object');
  }
  return validateRecipe(value, file);
}

/** A recipe holding the given settings (what the desktop app saves). */
export function makeRecipe(parts: Omit<Recipe, 'format' | 'version'>): Recipe {
  return { format: RECIPE_FORMAT, version: RECIPE_VERSION, ...parts };
}

/** The dip edits that apply to one gather: the recipe-wide list, then the gather's own. */
export function editsForGather(recipe: Recipe | undefined, keyValue: number): DipEdit[] {
  if (!recipe) return [];
  return [...(recipe.edits ?? []), ...(recipe.gathers?.[String(keyValue)]?.edits ?? [])];
}

/** The grid positions the recipe marks bad in one gather. */
export function badTracesForGather(recipe: Recipe | undefined, keyValue: number): number[] {
  return [...(recipe?.gathers?.[String(keyValue)]?.badTraces ?? [])];
}
