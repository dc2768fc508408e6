/**
 * The whole job in one place: the open file, the current gather, the view, the dip field and the fill,
 * and the calls into the core worker. Components read it and call its methods; nothing here touches the
 * DOM except through io/host.ts (saves) and the injected storage.
 */
import type { FileProblem } from '../../../core/problems';
import { TraceStatus } from '../render/trace-status';
import { ViewState } from './view.svelte';
import { DipsState } from './dips.svelte';
import { FillState } from './fill.svelte';
import { Autosaver, loadWork, type KeyValueStore, type SavedWork } from './autosave';
import { DIP_EDIT_MODEL } from './dip-edit-model';
import { isCancelled, WorkerCallError, type RunningCall, type WorkerClient } from '../workers/rpc';
import type { FillResult, FillSettings, GatherKeyName, GatherPayload, HeaderField, OpenedFile, SlopeOptions, SourceRef, SpectraResult } from '../workers/protocol';

function inRange(v: unknown, lo: number, hi: number): boolean {
  return typeof v === 'number' && Number.isFinite(v) && v >= lo && v <= hi;
}
import { saveBytes } from '../io/host';
import { snrDb } from '../../../core/quality/snr';
import type { SaveKind } from '../../shared/ipc';
import { slopeUnitFactor, SLOPE_UNIT_LABEL } from '../../../core/slope/units';
import { badTracesForGather, editsForGather, makeRecipe, parseRecipe, type Recipe, type RecipeGather } from '../../../core/recipe/recipe';
import type { DipEdit } from '../../../core/slope/edits';
import type { FillProgress } from '../../../core/fill/pipeline';

export type Step = 'open' | 'look' | 'dips' | 'fill' | 'check' | 'save';

export interface Notice {
  kind: 'error' | 'warning' | 'info';
  text: string;
  code?: string;
}

export interface Cursor {
  trace: number;
  sample: number;
}

export class AppState {
  readonly view = new ViewState();
  readonly dips = new DipsState();
  readonly fill = new FillState();
  step = $state<Step>('open');
  file = $state.raw<OpenedFile | null>(null);
  gather = $state.raw<GatherPayload | null>(null);
  gatherIndex = $state(0);
  busy = $state<string | null>(null);
  notices = $state.raw<Notice[]>([]);
  cursor = $state.raw<Cursor | null>(null);
  header = $state.raw<HeaderField[] | null>(null);
  headerTrace = $state(-1);
  spectra = $state.raw<SpectraResult | null>(null);
  /** Score of the fill against a reference file (synthetic tests only). */
  truth = $state.raw<{ name: string; snrDb: number; traces: number; holdoutSnrDb: number | null; shift: number; mismatch: number } | null>(null);
  restoredFrom = $state<string | null>(null);
  spacingM = $state<number | null>(null);
  factor = $state(1);
  exporting = $state<string | null>(null);
  readonly #io: WorkerClient;
  readonly #jobs: WorkerClient;
  readonly #store: KeyValueStore;
  readonly autosaver: Autosaver;
  #fillCall: RunningCall<FillResult> | null = null;
  #exportCall: RunningCall<unknown> | null = null;
  /** The last exported SEG-Y, kept so it can be opened again at once (and checked by the end-to-end test). */
  lastExport: { blob: Blob; name: string } | null = null;
  #saved: SavedWork | null = null;
  #headerTimer: ReturnType<typeof setTimeout> | null = null;

  constructor(io: WorkerClient, jobs: WorkerClient, store: KeyValueStore) {
    this.#io = io;
    this.#jobs = jobs;
    this.#store = store;
    this.autosaver = new Autosaver(store);
  }

  /** Shows a message; information fades after 10 s, warnings and errors stay until dismissed. */
  notify(n: Notice): void {
    this.notices = [...this.notices.slice(-4), n];
    if (n.kind === 'info') setTimeout(() => { this.notices = this.notices.filter((x) => x !== n); }, 10_000);
  }

  dismiss(i: number): void {
    this.notices = this.notices.filter((_, j) => j !== i);
  }

  /** Turns any failure into a notice: coded input problems verbatim with their code, defects as such. */
  report(e: unknown, doing: string): void {
    if (isCancelled(e)) {
      this.notify({ kind: 'info', text: `${doing}: cancelled.` });
      return;
    }
    if (e instanceof WorkerCallError && e.payload.kind === 'input') {
      this.notify({ kind: 'error', text: e.payload.message, code: e.payload.problem?.code });
      return;
    }
    const msg = e instanceof Error ? e.message : String(e);
    const code = /\[([a-z]+\.[a-z-]+)\]\s*$/.exec(msg)?.[1];
    this.notify({ kind: 'error', text: code ? msg : `${doing} failed (a defect in Dipweave, please report it): ${msg}`, code });
  }

  #warn(problems: readonly FileProblem[]): void {
    for (const p of problems) this.notify({ kind: 'warning', text: p.message + (p.hint ? ` ${p.hint}` : ''), code: p.code });
  }

  // ---- opening -------------------------------------------------------------------------------------------

  async openSource(source: SourceRef, name: string): Promise<boolean> {
    this.busy = `Opening ${name}…`;
    try {
      this.autosaver.flush();
      const opened = await this.#io.call('open', { source, name });
      const first = await this.#io.call('read', { gather: 0 });
      // File and gather change together, so the screen never shows a new name over an old gather.
      this.spacingM = null;
      this.factor = 1;
      this.file = opened;
      this.#saved = loadWork(this.#store, opened.name, opened.sizeBytes);
      this.restoredFrom = this.#saved ? this.#saved.savedAtIso : null;
      if (this.#saved?.settings) this.#restoreSettings(this.#saved.settings);
      this.#warn(opened.warnings);
      this.#showGather(first);
      this.step = 'look';
      return true;
    } catch (e) {
      this.report(e, `Opening ${name}`);
      return false;
    } finally {
      this.busy = null;
    }
  }

  async regroup(key: GatherKeyName): Promise<void> {
    if (!this.file) return;
    this.busy = 'Grouping traces…';
    try {
      this.autosaver.flush();
      const file = await this.#io.call('regroup', { key, spacingM: this.spacingM, factor: this.factor });
      const first = await this.#io.call('read', { gather: 0 });
      this.file = file;
      this.#showGather(first);
    } catch (e) {
      this.report(e, 'Grouping');
    } finally {
      this.busy = null;
    }
  }

  /**
   * Regular decimation to fill: k−1 new positions between neighbouring recorded traces (the CLI's --factor).
   * Needed when the headers show only the coarse grid (every second group kept: 25 m instead of 12.5 m).
   */
  async setFactor(k: number): Promise<void> {
    this.factor = Number.isInteger(k) && k >= 1 ? k : 1;
    if (this.file) await this.regroup(this.file.key);
  }

  /** Grid spacing override (null = from the headers); required for files whose headers carry no geometry. */
  async setSpacing(m: number | null): Promise<void> {
    this.spacingM = m;
    if (this.file) await this.regroup(this.file.key);
  }

  async stepGather(delta: number): Promise<void> {
    if (!this.file) return;
    const next = Math.min(this.file.gathers.length - 1, Math.max(0, this.gatherIndex + delta));
    if (next !== this.gatherIndex) await this.loadGather(next);
  }

  async loadGather(index: number): Promise<void> {
    if (!this.file) return;
    this.autosaver.flush();
    try {
      this.#showGather(await this.#io.call('read', { gather: index }));
    } catch (e) {
      this.report(e, 'Reading the gather');
    }
  }

  #showGather(g: GatherPayload): void {
    // A running fill belongs to the gather it started on.
    this.#fillCall?.cancel();
    const index = g.index;
    this.#warn(g.warnings);
    this.gatherIndex = index;
    this.gather = g;
    this.view.setShape(g.nTraces, g.nSamples);
    const work = this.#saved?.gathers[String(g.keyValue)];
    let edits = work ? DIP_EDIT_MODEL.validate(work.edits) : [];
    if (edits === null) {
      this.notify({ kind: 'warning', text: 'Saved dip edits for this gather could not be read and were left out.' });
      edits = [];
    }
    this.dips.setGather(g.nTraces, g.nSamples, edits);
    this.fill.setGather(g.present, g.dead, work?.bad ?? [], g.factor);
    this.spectra = null;
    this.truth = null;
    this.header = null;
    this.headerTrace = -1;
  }

  // ---- what is on screen -----------------------------------------------------------------------------------

  /** Status per grid position, for the strip, the legend and the picture. */
  status(): Uint8Array {
    const g = this.gather;
    if (!g) return new Uint8Array(0);
    const st = new Uint8Array(g.nTraces);
    const unknown = this.fill.unknown;
    const filled = this.fill.result !== null && this.view.compare !== 'before';
    for (let x = 0; x < g.nTraces; x++) {
      if (g.filledFlag[x]) st[x] = TraceStatus.filled;
      else if (filled && unknown[x]) st[x] = TraceStatus.filled;
      else if (!g.present[x]) st[x] = TraceStatus.missing;
      else if (unknown[x] && g.dead[x]) st[x] = TraceStatus.dead;
      else if (unknown[x]) st[x] = TraceStatus.markedBad;
      else st[x] = TraceStatus.live;
    }
    return st;
  }

  /** Samples for the chosen comparison: before (input), after (filled) or their difference. */
  shownSamples(): Float32Array | null {
    const g = this.gather;
    if (!g) return null;
    const r = this.fill.result;
    if (!r || this.view.compare === 'before') return g.data;
    if (this.view.compare === 'after') return r.data;
    const d = new Float32Array(r.data.length);
    for (let i = 0; i < d.length; i++) d[i] = r.data[i] - g.data[i];
    return d;
  }

  setCursor(c: Cursor | null): void {
    this.cursor = c;
    const g = this.gather;
    const trace = c ? Math.floor(c.trace) : -1;
    if (!g || trace < 0 || trace === this.headerTrace) return;
    this.headerTrace = trace;
    // Header reads go to the worker; debounce so moving across many traces issues one read.
    if (this.#headerTimer) clearTimeout(this.#headerTimer);
    this.#headerTimer = setTimeout(() => void this.#readHeader(trace), 60);
  }

  async #readHeader(trace: number): Promise<void> {
    const g = this.gather;
    if (!g) return;
    const ft = g.fileTrace[trace];
    if (ft < 0) {
      this.header = [];
      return;
    }
    try {
      this.header = await this.#io.call('header', { fileTrace: ft });
    } catch (e) {
      this.report(e, 'Reading a trace header');
    }
  }

  // ---- slopes ----------------------------------------------------------------------------------------------

  async estimateSlopes(): Promise<void> {
    const g = this.gather;
    if (!g || this.dips.running) return;
    this.dips.running = true;
    try {
      const plan = this.fill.plan!;
      const r = await this.#jobs.call('slopes', {
        data: g.data.slice(), nTraces: g.nTraces, nSamples: g.nSamples, dtSeconds: g.dtSeconds,
        unknown: this.fill.unknown, factor: plan.factor, options: { ...this.dips.options },
      });
      // The user may have stepped to another gather meanwhile: a field belongs to the gather it was made on.
      if (this.gather !== g) return;
      this.dips.setEstimate(r);
      this.view.dipLayer = true;
    } catch (e) {
      this.report(e, 'Slope estimation');
    } finally {
      this.dips.running = false;
    }
  }

  /** Edits change the work: autosave shortly after. */
  touched(): void {
    const f = this.file;
    const g = this.gather;
    if (!f || !g) return;
    this.autosaver.schedule(() => this.#snapshot());
  }

  #snapshot(): SavedWork {
    const f = this.file!;
    const g = this.gather!;
    const prev = this.#saved?.fileName === f.name && this.#saved.sizeBytes === f.sizeBytes ? this.#saved : null;
    const gathers = { ...(prev?.gathers ?? {}) };
    gathers[String(g.keyValue)] = { edits: [...this.dips.edits], bad: this.fill.badTraces };
    const work: SavedWork = {
      version: 1, fileName: f.name, sizeBytes: f.sizeBytes, gatherKey: f.key, savedAtIso: new Date().toISOString(),
      gathers, settings: this.#settings(),
    };
    this.#saved = work;
    return work;
  }

  #settings(): Record<string, unknown> {
    return { view: this.view.toJSON(), slope: { ...this.dips.options }, fill: { ...this.fill.settings } };
  }

  /** Settings from autosave: each value is checked and anything odd is ignored (defaults stay). */
  #restoreSettings(s: Record<string, unknown>): void {
    if (s.view && typeof s.view === 'object') this.view.restore(s.view as Record<string, never>);
    const o = s.slope as Partial<SlopeOptions> | undefined;
    if (o && typeof o === 'object') {
      const d = this.dips.options;
      this.dips.options = {
        method: o.method === 'pwd' || o.method === 'tensor' ? o.method : d.method,
        radiusTimeSamples: inRange(o.radiusTimeSamples, 1, 1000) ? o.radiusTimeSamples! : d.radiusTimeSamples,
        radiusTraces: inRange(o.radiusTraces, 1, 1000) ? o.radiusTraces! : d.radiusTraces,
        order: o.order === 1 || o.order === 2 ? o.order : d.order,
      };
    }
    const f = s.fill as Partial<FillSettings> | undefined;
    if (f && typeof f === 'object') {
      const d = this.fill.settings;
      this.fill.settings = {
        solver: f.solver === 'lsq' || f.solver === 'net' ? f.solver : d.solver,
        maxIterations: inRange(f.maxIterations, 1, 100_000) ? Math.round(f.maxIterations!) : d.maxIterations,
        tolerance: inRange(f.tolerance, 1e-12, 1) ? f.tolerance! : d.tolerance,
        steps: inRange(f.steps, 1, 1_000_000) ? Math.round(f.steps!) : d.steps,
        seed: inRange(f.seed, 0, 2 ** 31 - 1) ? Math.round(f.seed!) : d.seed,
        holdout: typeof f.holdout === 'boolean' ? f.holdout : d.holdout,
        secondPass: typeof f.secondPass === 'boolean' ? f.secondPass : d.secondPass,
      };
    }
  }

  // ---- fill ------------------------------------------------------------------------------------------------

  async runFill(): Promise<void> {
    const g = this.gather;
    const plan = this.fill.plan;
    if (!g || !plan || this.fill.running) return;
    if (this.fill.toFill === 0) {
      this.notify({ kind: 'info', text: 'Nothing to fill in this gather: every position holds a recorded trace.' });
      return;
    }
    this.fill.begin(performance.now());
    const call = this.#jobs.start('fill', {
      data: g.data.slice(), nTraces: g.nTraces, nSamples: g.nSamples, plan,
      slopePairs: this.dips.effectivePairs(), settings: { ...this.fill.settings }, slopeOptions: { ...this.dips.options },
    }, {
      onProgress: (p: FillProgress) => this.fill.progress(p.stage, p.fraction, p.solver, performance.now()),
    });
    this.#fillCall = call;
    try {
      const r = await call.result;
      if (this.gather !== g) {
        this.notify({ kind: 'info', text: `The fill of gather ${g.keyValue} finished after you moved on; it was not kept.` });
        return;
      }
      this.fill.finish(r);
      this.view.compare = 'after';
      this.spectra = null;
      this.truth = null;
    } catch (e) {
      if (this.gather === g) this.fill.finish(null);
      this.report(e, 'Fill');
    } finally {
      this.#fillCall = null;
    }
  }

  cancelFill(): void {
    this.#fillCall?.cancel();
  }

  /** Stops "fill and save all gathers"; nothing is saved. */
  cancelExport(): void {
    if (this.#exportCall && !this.#exportCall.cancel())
      this.notify({ kind: 'warning', text: 'This window cannot stop the export midway (it is not cross-origin isolated); it will finish on its own.' });
  }

  /**
   * Scores the fill on screen against a reference file holding the complete recordings (a synthetic test such
   * as the demo's grv07-full.sgy): SNR on the filled positions only (core/quality/snr.ts), beside the hold-out
   * score that predicts it on real data.
   */
  async scoreAgainst(blob: Blob, name: string): Promise<void> {
    const g = this.gather;
    const r = this.fill.result;
    if (!g || !r || !this.file) return;
    try {
      const ref = await this.#jobs.call('reference', {
        blob, name, key: this.file.key, keyValue: g.keyValue, data: g.data.slice(), present: g.present, nTraces: g.nTraces, nSamples: g.nSamples,
      });
      if (this.gather !== g || this.fill.result !== r) return;
      const filled: number[] = [];
      const unknown = this.fill.unknown;
      for (let x = 0; x < g.nTraces; x++) if (unknown[x]) filled.push(x);
      this.truth = { name, snrDb: snrDb(ref.data, r.data, filled, g.nSamples), traces: filled.length, holdoutSnrDb: r.holdoutSnrDb, shift: ref.shift, mismatch: ref.mismatch };
    } catch (e) {
      this.report(e, 'Scoring against the reference');
    }
  }

  async computeSpectra(): Promise<void> {
    const g = this.gather;
    if (!g) return;
    const r = this.fill.result;
    const unknown = this.fill.unknown;
    const live: number[] = [];
    const filled: number[] = [];
    for (let x = 0; x < g.nTraces; x++) (unknown[x] ? filled : live).push(x);
    try {
      this.spectra = await this.#jobs.call('spectra', {
        before: g.data.slice(), after: r ? r.data.slice() : null, nTraces: g.nTraces, nSamples: g.nSamples,
        dtSeconds: g.dtSeconds, spacingM: g.spacingM, liveTraces: live, filledTraces: filled,
      });
    } catch (e) {
      this.report(e, 'Spectra');
    }
  }

  // ---- export ----------------------------------------------------------------------------------------------

  /** Saves through the desktop dialog or as a download, and says where it went. */
  async saveFile(name: string, kind: SaveKind, data: Blob | Uint8Array): Promise<boolean> {
    try {
      const r = await saveBytes(name, kind, data);
      if (r.saved) this.notify({ kind: 'info', text: `Saved ${r.name} (${r.sizeBytes < 10_240 ? `${r.sizeBytes} bytes` : `${(r.sizeBytes / 1024).toFixed(0)} KiB`}).` });
      return r.saved;
    } catch (e) {
      this.report(e, `Saving ${name}`);
      return false;
    }
  }

  #baseName(): string {
    return (this.file?.name ?? 'gather').replace(/\.(sgy|segy)$/i, '');
  }

  /** How the traces were made, for the textual-header note of the output. */
  methodText(withScore = true): string {
    const s = this.fill.settings;
    const solver = s.solver === 'lsq' ? `LEAST-SQUARES PLANE-WAVE FILL (CG, MAX ${s.maxIterations} IT.)` : `COORDINATE NETWORK (${s.steps} STEPS, SEED ${s.seed})`;
    const o = this.dips.options;
    const dips = `${o.method === 'pwd' ? 'PLANE-WAVE DESTRUCTION' : 'STRUCTURE TENSOR'} SLOPES, RADII ${o.radiusTimeSamples} SAMPLES X ${o.radiusTraces} TRACES`;
    const edits = this.dips.edits.length ? `, ${this.dips.edits.length} HAND EDITS` : '';
    const score = this.fill.result?.holdoutSnrDb;
    const ho = withScore && score !== null && score !== undefined && Number.isFinite(score) ? `; HOLD-OUT SCORE ${score.toFixed(1)} DB` : '';
    return `${solver}; ${dips}${edits}${ho}. DIPWEAVE DESKTOP.`;
  }

  async exportGather(): Promise<void> {
    const g = this.gather;
    if (!g || this.exporting) return;
    if (!this.fill.result && this.fill.toFill > 0) {
      await this.runFill();
      if (!this.fill.result) return;
    }
    const r = this.fill.result;
    this.exporting = 'Writing the gather…';
    try {
      const out = await this.#io.call('writeGather', {
        gather: this.gatherIndex, data: r ? r.data : g.data, filled: r ? this.fill.unknown : new Uint8Array(g.nTraces), method: this.methodText(),
      });
      this.lastExport = { blob: out.blob, name: `${this.#baseName()}-${g.keyValue}-filled.sgy` };
      await this.saveFile(this.lastExport.name, 'segy', out.blob);
    } catch (e) {
      this.report(e, 'Writing SEG-Y');
    } finally {
      this.exporting = null;
    }
  }

  async exportAll(): Promise<void> {
    const f = this.file;
    if (!f || this.exporting) return;
    this.autosaver.flush();
    const snap = this.gather ? this.#snapshot() : null;
    const r = this.fill.result;
    this.exporting = 'Filling every gather…';
    try {
      const call = this.#io.start('fillAll', {
        slope: { ...this.dips.options }, settings: { ...this.fill.settings }, method: this.methodText(false),
        work: Object.fromEntries(Object.entries(snap?.gathers ?? {}).map(([k, v]) => [k, { edits: v.edits, bad: v.bad }])),
        current: r && this.gather ? { gather: this.gatherIndex, data: r.data, filled: this.fill.unknown } : null,
      }, {
        onProgress: (p) => { this.exporting = `Filling gather ${p.gather + 1} of ${p.of} (key ${p.keyValue})…`; },
      });
      this.#exportCall = call;
      const out = await call.result;
      const scores = out.report.map((x) => x.holdoutSnrDb).filter((x): x is number => x !== null && Number.isFinite(x));
      this.notify({ kind: 'info', text: `Filled ${out.filledTraces} traces in ${out.gathers} gathers.${scores.length ? ` Hold-out scores ${Math.min(...scores).toFixed(1)} to ${Math.max(...scores).toFixed(1)} dB.` : ''}` });
      this.lastExport = { blob: out.blob, name: `${this.#baseName()}-filled.sgy` };
      await this.saveFile(this.lastExport.name, 'segy', out.blob);
    } catch (e) {
      this.report(e, 'Filling all gathers');
    } finally {
      this.exporting = null;
      this.#exportCall = null;
    }
  }

  async exportSlopes(): Promise<void> {
    const g = this.gather;
    const field = this.dips.effectiveTraces();
    if (!g || !field || this.exporting) return;
    const unit = this.view.slopeUnit;
    let factor: number;
    try {
      factor = slopeUnitFactor(unit, { sampleIntervalS: g.dtSeconds, traceSpacingM: g.spacingM ?? undefined });
    } catch (e) {
      this.report(e, 'Slope units');
      return;
    }
    const values = new Float32Array(field.length);
    for (let i = 0; i < field.length; i++) values[i] = field[i] * factor;
    this.exporting = 'Writing the slope field…';
    try {
      const label = SLOPE_UNIT_LABEL[unit];
      const o = this.dips.options;
      const out = await this.#io.call('writeSlopes', {
        gather: this.gatherIndex, slopeTraces: values, unitLabel: label,
        method: `SLOPE FIELD, NOT AMPLITUDES: SAMPLE VALUES ARE SLOPES IN ${label.toUpperCase()} (POSITIVE = LATER AT HIGHER POSITION); ${o.method === 'pwd' ? 'PLANE-WAVE DESTRUCTION' : 'STRUCTURE TENSOR'}, RADII ${o.radiusTimeSamples} X ${o.radiusTraces}${this.dips.edits.length ? `, ${this.dips.edits.length} HAND EDITS` : ''}.`,
      });
      await this.saveFile(`${this.#baseName()}-${g.keyValue}-dips-${unit}.sgy`, 'segy', out.blob);
    } catch (e) {
      this.report(e, 'Writing the slope field');
    } finally {
      this.exporting = null;
    }
  }

  // ---- recipes ---------------------------------------------------------------------------------------------

  /** The recipe of the work so far: settings plus dip edits and bad traces per gather (core/recipe/recipe.ts). */
  recipe(): Recipe {
    const snap = this.gather ? this.#snapshot() : this.#saved;
    const gathers: Record<string, RecipeGather> = {};
    for (const [k, v] of Object.entries(snap?.gathers ?? {})) {
      const edits = DIP_EDIT_MODEL.validate(v.edits) ?? [];
      if (!edits.length && !v.bad.length) continue;
      gathers[k] = { ...(edits.length ? { edits: edits as DipEdit[] } : {}), ...(v.bad.length ? { badTraces: [...v.bad] } : {}) };
    }
    const s = this.fill.settings;
    const o = this.dips.options;
    return makeRecipe({
      ...(this.file ? { gatherKey: this.file.key } : {}),
      ...(this.spacingM ? { spacingM: this.spacingM } : {}),
      ...(this.factor > 1 ? { factor: this.factor } : {}),
      fill: { solver: s.solver, lsq: { maxIterations: s.maxIterations, tolerance: s.tolerance }, net: { steps: s.steps, seed: s.seed }, holdout: s.holdout, secondPass: s.secondPass },
      slopes: { method: o.method, radiusTimeSamples: o.radiusTimeSamples, radiusTraces: o.radiusTraces, order: o.order },
      gathers,
    });
  }

  async saveRecipe(): Promise<void> {
    const text = JSON.stringify(this.recipe(), null, 2);
    await this.saveFile(`${this.#baseName()}.recipe.json`, 'recipe', new Blob([text], { type: 'application/json' }));
  }

  /** Reads a recipe (strictly: a bad one is refused with its coded problem) and applies it to the open file. */
  async loadRecipe(file: Blob & { name?: string }): Promise<void> {
    try {
      const r = parseRecipe(await file.text(), file.name);
      const s = r.fill ?? {};
      this.fill.settings = {
        ...this.fill.settings,
        ...(s.solver ? { solver: s.solver } : {}),
        ...(s.lsq?.maxIterations !== undefined ? { maxIterations: s.lsq.maxIterations } : {}),
        ...(s.lsq?.tolerance !== undefined ? { tolerance: s.lsq.tolerance } : {}),
        ...(s.net?.steps !== undefined ? { steps: s.net.steps } : {}),
        ...(s.net?.seed !== undefined ? { seed: s.net.seed } : {}),
        ...(s.holdout !== undefined ? { holdout: s.holdout } : {}),
        ...(s.secondPass !== undefined ? { secondPass: s.secondPass } : {}),
      };
      const o = r.slopes ?? {};
      this.dips.options = {
        method: o.method ?? this.dips.options.method,
        radiusTimeSamples: o.radiusTimeSamples ?? this.dips.options.radiusTimeSamples,
        radiusTraces: o.radiusTraces ?? this.dips.options.radiusTraces,
        order: o.order ?? this.dips.options.order,
      };
      if (!this.file) return;
      // Edits and bad traces per gather replace what was there; the next autosave keeps them.
      const gathers: SavedWork['gathers'] = {};
      for (const g of this.file.gathers) {
        const edits = editsForGather(r, g.keyValue);
        const bad = badTracesForGather(r, g.keyValue);
        if (edits.length || bad.length) gathers[String(g.keyValue)] = { edits, bad };
      }
      this.#saved = {
        version: 1, fileName: this.file.name, sizeBytes: this.file.sizeBytes, gatherKey: r.gatherKey ?? this.file.key,
        savedAtIso: new Date().toISOString(), gathers, settings: this.#settings(),
      };
      const regrid = (r.spacingM !== undefined && r.spacingM !== this.spacingM) || (r.factor !== undefined && r.factor !== this.factor);
      if (r.spacingM !== undefined) this.spacingM = r.spacingM;
      if (r.factor !== undefined) this.factor = r.factor;
      if (regrid || (r.gatherKey && r.gatherKey !== this.file.key)) await this.regroup(r.gatherKey ?? this.file.key);
      else await this.loadGather(this.gatherIndex);
      const n = Object.keys(gathers).length;
      this.notify({ kind: 'info', text: `Recipe loaded: settings${n ? `, and edits or marked traces for ${n} gather${n === 1 ? '' : 's'}` : ''}.` });
      this.touched();
    } catch (e) {
      this.report(e, 'Reading the recipe');
    }
  }
}
