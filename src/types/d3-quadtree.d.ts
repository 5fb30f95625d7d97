/**
 * The part of d3-quadtree (installed with d3-force, which builds on it) that the map's
 * overview uses to find the person under the pointer.
 */
declare module 'd3-quadtree' {
  export interface Quadtree<T> {
    x(): (d: T) => number;
    x(x: (d: T) => number): this;
    y(): (d: T) => number;
    y(y: (d: T) => number): this;
    addAll(data: readonly T[]): this;
    find(x: number, y: number, radius?: number): T | undefined;
    size(): number;
  }
  export function quadtree<T>(data?: readonly T[], x?: (d: T) => number, y?: (d: T) => number): Quadtree<T>;
}
