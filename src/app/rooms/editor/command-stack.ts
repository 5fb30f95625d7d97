import type { EditorOp } from './room-model';

/** One user action: what it did and what undoes it (both lists applied in order). */
export interface Command {
  label: string;
  redo: EditorOp[];
  undo: EditorOp[];
}

/**
 * Undo and redo history. A new command clears the redo side; the history keeps the last
 * `limit` commands so a long session does not grow without bound.
 */
export class CommandStack {
  private done: Command[] = [];
  private undone: Command[] = [];

  constructor(private readonly limit = 200) {}

  push(cmd: Command): void {
    this.done.push(cmd);
    if (this.done.length > this.limit) this.done.shift();
    this.undone = [];
  }

  /** The command to undo (moved to the redo side), or null. */
  undo(): Command | null {
    const cmd = this.done.pop();
    if (!cmd) return null;
    this.undone.push(cmd);
    return cmd;
  }

  redo(): Command | null {
    const cmd = this.undone.pop();
    if (!cmd) return null;
    this.done.push(cmd);
    return cmd;
  }

  get canUndo(): boolean {
    return this.done.length > 0;
  }

  get canRedo(): boolean {
    return this.undone.length > 0;
  }

  get undoLabel(): string | null {
    return this.done.at(-1)?.label ?? null;
  }

  get redoLabel(): string | null {
    return this.undone.at(-1)?.label ?? null;
  }

  clear(): void {
    this.done = [];
    this.undone = [];
  }
}
