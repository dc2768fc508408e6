/**
 * Undo and redo over an append-only list of edits, without a limit in a session (issue 6 item 5).
 * Plain class (no runes) so it is testable in node; the owning .svelte.ts state mirrors `version`.
 */
export class EditHistory<E> {
  #done: E[] = [];
  #undone: E[] = [];
  #version = 0;

  constructor(initial: readonly E[] = []) {
    this.#done = [...initial];
  }

  /** Edits in effect, oldest first. */
  get edits(): readonly E[] {
    return this.#done;
  }

  get canUndo(): boolean {
    return this.#done.length > 0;
  }

  get canRedo(): boolean {
    return this.#undone.length > 0;
  }

  /** Bumps on every change; cheap change detection for autosave and redraw. */
  get version(): number {
    return this.#version;
  }

  /** A new edit clears the redo list (the usual linear history, common practice). */
  push(edit: E): void {
    this.#done.push(edit);
    this.#undone = [];
    this.#version++;
  }

  undo(): E | undefined {
    const e = this.#done.pop();
    if (e !== undefined) {
      this.#undone.push(e);
      this.#version++;
    }
    return e;
  }

  redo(): E | undefined {
    const e = this.#undone.pop();
    if (e !== undefined) {
      this.#done.push(e);
      this.#version++;
    }
    return e;
  }

  /** Replaces everything (restore from autosave or a recipe); a load starts a fresh history. */
  reset(edits: readonly E[]): void {
    this.#done = [...edits];
    this.#undone = [];
    this.#version++;
  }
}
