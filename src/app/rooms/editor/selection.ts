/** Which people (and at most one tie) are selected on the map and in the tables. */
export class Selection {
  private people = new Set<string>();
  tie: string | null = null;

  get size(): number {
    return this.people.size;
  }

  has(lid: string): boolean {
    return this.people.has(lid);
  }

  ids(): string[] {
    return [...this.people];
  }

  /** A plain click: only this person. */
  only(lid: string): void {
    this.people = new Set([lid]);
    this.tie = null;
  }

  /** Shift-click: add or remove this person, keep the rest. */
  toggle(lid: string): void {
    if (this.people.has(lid)) this.people.delete(lid);
    else this.people.add(lid);
    this.tie = null;
  }

  /** Rubber band: everyone inside the box; with `add`, on top of the current selection. */
  box(points: Iterable<{ lid: string; x: number; y: number }>, x0: number, y0: number, x1: number, y1: number, add: boolean): void {
    const [left, right] = x0 <= x1 ? [x0, x1] : [x1, x0];
    const [top, bottom] = y0 <= y1 ? [y0, y1] : [y1, y0];
    if (!add) this.people = new Set();
    for (const p of points) {
      if (p.x >= left && p.x <= right && p.y >= top && p.y <= bottom) this.people.add(p.lid);
    }
    this.tie = null;
  }

  selectTie(lid: string): void {
    this.people = new Set();
    this.tie = lid;
  }

  clear(): void {
    this.people = new Set();
    this.tie = null;
  }

  /** Drops ids that no longer exist (after an undo removed a person, or a reload). */
  keepOnly(exists: (lid: string) => boolean, tieExists: (lid: string) => boolean): void {
    this.people = new Set([...this.people].filter(exists));
    if (this.tie && !tieExists(this.tie)) this.tie = null;
  }
}
