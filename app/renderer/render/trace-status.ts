/**
 * What each trace position of the displayed gather is. The section view, the legend and the fill plan
 * overlay share these codes (display only; the fill plan itself lives in core/fill).
 */
export const TraceStatus = {
  live: 0,
  /** No trace recorded at this grid position (gap, decimation). */
  missing: 1,
  /** Recorded but flagged dead in its header, or all zero. */
  dead: 2,
  /** Estimated by the fill: not a recording. */
  filled: 3,
  /** A live trace the user marked as bad: it will be replaced by the fill. */
  markedBad: 4,
} as const;
export type TraceStatusCode = (typeof TraceStatus)[keyof typeof TraceStatus];

export interface StatusStyle {
  readonly label: string;
  readonly colour: string;
  /** A shape cue besides colour, so the marks read without colour vision. */
  readonly pattern: 'plain' | 'hatch' | 'cross' | 'bar' | 'dot';
  readonly meaning: string;
}

export const STATUS_STYLES: Record<TraceStatusCode, StatusStyle> = {
  0: { label: 'live', colour: '#8a8f98', pattern: 'plain', meaning: 'recorded trace' },
  1: { label: 'missing', colour: '#e08a1e', pattern: 'hatch', meaning: 'no trace at this position' },
  2: { label: 'dead', colour: '#23252b', pattern: 'cross', meaning: 'flagged dead or all zero' },
  3: { label: 'filled', colour: '#1f9e89', pattern: 'bar', meaning: 'estimated by the fill, not recorded' },
  4: { label: 'marked bad', colour: '#c2378a', pattern: 'dot', meaning: 'you marked it; the fill replaces it' },
};

export function countStatuses(status: Uint8Array): Record<TraceStatusCode, number> {
  const c: Record<TraceStatusCode, number> = { 0: 0, 1: 0, 2: 0, 3: 0, 4: 0 };
  for (let i = 0; i < status.length; i++) c[status[i] as TraceStatusCode]++;
  return c;
}

/** Runs of consecutive positions with the given statuses, as [first, last] inclusive. */
export function runsOf(status: Uint8Array, codes: readonly number[]): Array<[number, number]> {
  const runs: Array<[number, number]> = [];
  let start = -1;
  for (let i = 0; i <= status.length; i++) {
    const inRun = i < status.length && codes.includes(status[i]);
    if (inRun && start < 0) start = i;
    if (!inRun && start >= 0) {
      runs.push([start, i - 1]);
      start = -1;
    }
  }
  return runs;
}
