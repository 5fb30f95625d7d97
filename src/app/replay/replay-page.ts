import {
  ChangeDetectionStrategy,
  Component,
  computed,
  type ElementRef,
  inject,
  input,
  type OnDestroy,
  type OnInit,
  signal,
  viewChild,
  afterRenderEffect,
} from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { concatMap, from, map, tap } from 'rxjs';
import type { ReplayIndex, ReplaySample } from '../../../shared/api/plans';
import { toApiError } from '../core/api-error';
import { drawFrame } from './replay-canvas';
import { ReplayData } from './replay-data';
import { replayLayout } from './replay-layout';
import { replayScene, type ReplayScene } from './replay-scene';
import { buildTimeline, clampTime, heardAtHop, reachedCount, stepHop, type Timeline } from './replay-timeline';
import { itemAt } from '../../../shared/checked';

const SPEEDS = [0.5, 1, 2, 4] as const;

/** The projector replay: one stored cascade, animated hop by hop on a canvas. */
@Component({
  selector: 'app-replay-page',
  imports: [MatIconModule, RouterLink],
  templateUrl: './replay-page.html',
  styleUrl: './replay-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '(window:keydown)': 'handleKey($event)', '(window:resize)': 'resize()' },
})
export default class ReplayPage implements OnInit, OnDestroy {
  readonly rehearsalId = input.required<string>();
  private readonly data = inject(ReplayData);
  private readonly canvas = viewChild<ElementRef<HTMLCanvasElement>>('stage');
  private readonly host = viewChild<ElementRef<HTMLElement>>('shell');

  protected readonly speeds = SPEEDS;
  protected readonly error = signal<string | null>(null);
  protected readonly index = signal<ReplayIndex | null>(null);
  protected readonly samples = signal<ReplaySample[]>([]);
  protected readonly sampleNo = signal(0);
  protected readonly t = signal(0);
  protected readonly playing = signal(false);
  protected readonly speed = signal<number>(1);

  protected readonly timeline = computed<Timeline | null>(() => {
    const s = this.samples()[this.sampleNo()];
    const idx = this.index();
    if (!s || !idx) return null;
    const starters = idx.people.filter((p) => p.starter).map((p) => p.index);
    return buildTimeline({ n: idx.people.length, starters, heardAt: s.heardAt, chains: s.chains });
  });
  protected readonly hop = computed(() => Math.floor(this.t() + 1e-9));
  protected readonly reached = computed(() => {
    const tl = this.timeline();
    return tl ? reachedCount(tl, this.t()) : 0;
  });
  protected readonly justHeard = computed(() => {
    const tl = this.timeline();
    const idx = this.index();
    if (!tl || !idx) return [];
    return heardAtHop(tl, this.hop()).map((i) => itemAt(idx.people, i, 'replay person').name);
  });
  /** At 1x a hop a second, but never longer than 40 s for the whole cascade (long tails). */
  protected readonly hopsPerSecond = computed(() => Math.max(1, (this.timeline()?.lastHop ?? 0) / 40) * this.speed());
  protected readonly starterNames = computed(() => (this.index()?.people ?? []).filter((p) => p.starter).map((p) => p.name));

  private layout: { x: Float64Array; y: Float64Array } | null = null;
  private names: string[] = [];
  private scene: ReplayScene | null = null;
  /** The names as drawn, with their boxes in canvas pixels: read by assistive technology and by the layout test. */
  protected readonly drawnNames = signal<{ text: string; name: string; initials: boolean; box: string }[]>([]);
  protected readonly initialsLegend = computed(() => this.drawnNames().filter((l) => l.initials));
  /** At hop 0 only the starters know: say that the message has set out. */
  protected readonly atStart = computed(() => this.hop() === 0);
  private frame = 0;
  private last = 0;
  private ctx: CanvasRenderingContext2D | null = null;
  private size = { w: 0, h: 0 };
  /** Draw times, for the projector's own smoothness check (read by the end-to-end test). */
  private readonly stats = { frames: 0, drawMs: [] as number[], gaps: [] as number[] };

  constructor() {
    // The canvas appears once the data is in: size it (and draw) whenever it (re)appears.
    let sized: HTMLCanvasElement | undefined;
    afterRenderEffect(() => {
      const canvas = this.canvas()?.nativeElement;
      if (canvas && canvas !== sized && this.timeline()) {
        sized = canvas;
        this.resize();
      }
    });
  }

  ngOnInit(): void {
    this.loadAll();
  }

  ngOnDestroy(): void {
    cancelAnimationFrame(this.frame);
  }

  private loadAll(): void {
    this.data
      .load(this.rehearsalId())
      .pipe(
        // Names are measured for placement: measure them in the real type, not a fallback.
        concatMap((data) =>
          from(
            Promise.all(['400 20px "Source Sans 3"', '700 20px "Source Sans 3"'].map((f) => document.fonts?.load(f).catch(() => []))),
          ).pipe(map(() => data)),
        ),
        // In the pipe, not in subscribe: a room the layout refuses ends up in the error message too.
        tap(({ index, samples }) => {
          if (!samples.length) throw new Error('This rehearsal kept no cascades to replay.');
          this.layout = replayLayout(index.people, index.ties);
          this.names = index.people.map((p) => p.name);
          this.index.set(index);
          this.samples.set(samples);
          (window as unknown as { __replayStats: unknown }).__replayStats = this.stats;
        }),
      )
      .subscribe({ error: (err: unknown) => this.error.set(toApiError(err).message) });
  }

  protected pickSample(n: number): void {
    this.sampleNo.set(n);
    this.t.set(0);
    this.playing.set(false);
    this.draw();
  }

  protected togglePlay(): void {
    const tl = this.timeline();
    if (!tl) return;
    if (!this.playing() && this.t() >= tl.lastHop) this.t.set(0);
    this.playing.set(!this.playing());
    if (this.playing()) {
      this.last = performance.now();
      this.frame = requestAnimationFrame((now) => this.tick(now));
    }
  }

  protected step(direction: 1 | -1): void {
    const tl = this.timeline();
    if (!tl) return;
    this.playing.set(false);
    this.t.set(stepHop(tl, this.t(), direction));
    this.draw();
  }

  protected scrub(value: string): void {
    const tl = this.timeline();
    if (!tl) return;
    this.playing.set(false);
    this.t.set(clampTime(tl, Number(value)));
    this.draw();
  }

  protected setSpeed(value: number): void {
    this.speed.set(value);
  }

  protected async fullScreen(): Promise<void> {
    const el = this.host()?.nativeElement;
    if (!el) return;
    if (document.fullscreenElement) await document.exitFullscreen().catch(() => undefined);
    else await el.requestFullscreen().catch(() => undefined);
  }

  protected handleKey(e: KeyboardEvent): void {
    if ((e.target as HTMLElement | null)?.tagName === 'SELECT') return;
    if (e.key === ' ') {
      e.preventDefault();
      this.togglePlay();
    } else if (e.key === 'ArrowRight') {
      e.preventDefault();
      this.step(1);
    } else if (e.key === 'ArrowLeft') {
      e.preventDefault();
      this.step(-1);
    } else if (e.key === 'f' || e.key === 'F') {
      void this.fullScreen();
    } else if (e.key === 'Home') {
      this.scrub('0');
    } else if (e.key === 'End') {
      this.scrub(String(this.timeline()?.lastHop ?? 0));
    }
  }

  private tick(now: number): void {
    const tl = this.timeline();
    if (!this.playing() || !tl) return;
    const dt = Math.min(0.1, (now - this.last) / 1000);
    this.stats.gaps.push(now - this.last);
    this.last = now;
    const next = clampTime(tl, this.t() + dt * this.hopsPerSecond());
    this.t.set(next);
    this.draw();
    if (next >= tl.lastHop) this.playing.set(false);
    else this.frame = requestAnimationFrame((n) => this.tick(n));
  }

  protected resize(): void {
    const canvas = this.canvas()?.nativeElement;
    if (!canvas) return;
    const rect = canvas.getBoundingClientRect();
    const ratio = window.devicePixelRatio || 1;
    canvas.width = Math.max(1, Math.round(rect.width * ratio));
    canvas.height = Math.max(1, Math.round(rect.height * ratio));
    this.ctx = canvas.getContext('2d');
    this.ctx?.setTransform(ratio, 0, 0, ratio, 0, 0);
    this.size = { w: rect.width, h: rect.height };
    this.placeScene();
    this.draw();
  }

  private placeScene(): void {
    if (!this.layout) return;
    const measure = measurer();
    this.scene = replayScene(this.layout, this.names, this.size.w, this.size.h, measure);
    const scene = this.scene;
    this.drawnNames.set(
      scene.labels.flatMap((l, i) => {
        if (!l) return [];
        const b = l.spot.box;
        const box = [b.x0, b.y0, b.x1, b.y1].map((v) => v.toFixed(1)).join(' ');
        return [{ text: l.text, name: itemAt(this.names, i, 'replay name'), initials: l.initials, box }];
      }),
    );
  }

  private draw(): void {
    const tl = this.timeline();
    const idx = this.index();
    if (!this.ctx || !tl || !idx || !this.scene) return;
    const start = performance.now();
    drawFrame({
      ctx: this.ctx,
      width: this.size.w,
      height: this.size.h,
      scene: this.scene,
      ties: idx.ties,
      timeline: tl,
      t: this.t(),
    });
    this.stats.frames++;
    this.stats.drawMs.push(performance.now() - start);
  }
}

/** Width of a name in the replay's type (bold, the wider of the two weights it is drawn in). */
function measurer(): (text: string, font: number) => number {
  const ctx = document.createElement('canvas').getContext('2d');
  return (text, font) => {
    if (!ctx) return text.length * font * 0.6;
    ctx.font = `700 ${font}px "Source Sans 3", sans-serif`;
    return Math.ceil(ctx.measureText(text).width) + 2;
  };
}
