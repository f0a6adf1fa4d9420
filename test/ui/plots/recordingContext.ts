import type { Canvas2DLike } from '../../../src/ui/plots/drawSpectrumFrame';

/** One stroked or filled path: its style and the subpaths (moveTo starts a new one) as [x, y] CSS px. */
export interface RecordedPath {
  op: 'stroke' | 'fill';
  style: string;
  subpaths: [number, number][][];
}

/** A fake 2-D context that remembers what was drawn (jsdom has no canvas). */
export class RecordingContext implements Canvas2DLike {
  fillStyle: string | CanvasGradient | CanvasPattern = '#000';
  strokeStyle: string | CanvasGradient | CanvasPattern = '#000';
  lineWidth = 1;
  globalAlpha = 1;
  lineJoin: CanvasLineJoin = 'miter';
  paths: RecordedPath[] = [];
  rects: { style: string; alpha: number; x: number; y: number; w: number; h: number }[] = [];
  clears = 0;
  private current: [number, number][][] = [];
  setTransform(): void {}
  clearRect(): void {
    this.clears++;
    this.paths = [];
    this.rects = [];
  }
  save(): void {}
  restore(): void {}
  beginPath(): void {
    this.current = [];
  }
  rect(): void {}
  clip(): void {}
  closePath(): void {}
  setLineDash(): void {}
  moveTo(x: number, y: number): void {
    this.current.push([[x, y]]);
  }
  lineTo(x: number, y: number): void {
    if (this.current.length === 0) this.current.push([]);
    this.current[this.current.length - 1].push([x, y]);
  }
  stroke(): void {
    this.paths.push({ op: 'stroke', style: String(this.strokeStyle), subpaths: this.current });
  }
  fill(): void {
    this.paths.push({ op: 'fill', style: String(this.fillStyle), subpaths: this.current });
  }
  fillRect(x: number, y: number, w: number, h: number): void {
    this.rects.push({ style: String(this.fillStyle), alpha: this.globalAlpha, x, y, w, h });
  }
}
