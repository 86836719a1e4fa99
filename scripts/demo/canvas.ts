// A few raster primitives over an RGBA buffer, enough to draw the demo's invented
// photos (no text, no marks). Pixels are written straight into the bitmap jimp
// encodes; per-pixel calls through jimp would be several times slower.
export type Rgb = [number, number, number]

export function hex(value: string): Rgb {
  const n = Number.parseInt(value.replace('#', ''), 16)
  return [(n >> 16) & 255, (n >> 8) & 255, n & 255]
}

export function mix(a: Rgb, b: Rgb, t: number): Rgb {
  return [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t, a[2] + (b[2] - a[2]) * t]
}

export function shade(c: Rgb, f: number): Rgb {
  return f >= 0 ? mix(c, [255, 255, 255], f) : mix(c, [0, 0, 0], -f)
}

export class Canvas {
  readonly data: Buffer
  constructor(readonly width: number, readonly height: number) {
    this.data = Buffer.alloc(width * height * 4, 255)
  }

  private put(x: number, y: number, c: Rgb, alpha = 1): void {
    if (x < 0 || y < 0 || x >= this.width || y >= this.height) return
    const i = (y * this.width + x) * 4
    const d = this.data
    if (alpha >= 1) {
      d[i] = c[0]; d[i + 1] = c[1]; d[i + 2] = c[2]
      return
    }
    d[i] = d[i]! + (c[0] - d[i]!) * alpha
    d[i + 1] = d[i + 1]! + (c[1] - d[i + 1]!) * alpha
    d[i + 2] = d[i + 2]! + (c[2] - d[i + 2]!) * alpha
  }

  /** A rectangle, optionally shaded from `top` to `bottom` colour. */
  rect(x: number, y: number, w: number, h: number, top: Rgb, bottom: Rgb = top, alpha = 1): void {
    const x0 = Math.max(0, Math.round(x)), x1 = Math.min(this.width, Math.round(x + w))
    const y0 = Math.max(0, Math.round(y)), y1 = Math.min(this.height, Math.round(y + h))
    for (let py = y0; py < y1; py++) {
      const c = mix(top, bottom, h > 1 ? (py - y) / h : 0)
      for (let px = x0; px < x1; px++) this.put(px, py, c, alpha)
    }
  }

  /** A filled ellipse, lit from the upper left when `lit` is set. */
  ellipse(cx: number, cy: number, rx: number, ry: number, c: Rgb, opts: { lit?: boolean, alpha?: number } = {}): void {
    const alpha = opts.alpha ?? 1
    for (let py = Math.floor(cy - ry); py <= Math.ceil(cy + ry); py++) {
      for (let px = Math.floor(cx - rx); px <= Math.ceil(cx + rx); px++) {
        const dx = (px - cx) / rx, dy = (py - cy) / ry
        const r = dx * dx + dy * dy
        if (r > 1) continue
        // A soft edge of about one pixel.
        const edge = Math.min(1, (1 - r) * Math.min(rx, ry) / 2)
        const lit = opts.lit ? shade(c, 0.25 * (-dx - dy) / 2 - 0.2 * r) : c
        this.put(px, py, lit, alpha * edge)
      }
    }
  }

  circle(cx: number, cy: number, r: number, c: Rgb, opts: { lit?: boolean, alpha?: number } = {}): void {
    this.ellipse(cx, cy, r, r, c, opts)
  }

  /** A thick line with round ends (a chain of discs), shaded across its width when `tube`. */
  line(x0: number, y0: number, x1: number, y1: number, width: number, c: Rgb, opts: { tube?: boolean, alpha?: number } = {}): void {
    const len = Math.hypot(x1 - x0, y1 - y0)
    const r = width / 2
    // A long diagonal's bounding box is mostly empty: draw it in short pieces.
    if (len > 6 * width + 40) {
      const mx = (x0 + x1) / 2, my = (y0 + y1) / 2
      this.line(x0, y0, mx, my, width, c, opts)
      this.line(mx, my, x1, y1, width, c, opts)
      return
    }
    const nx = len ? -(y1 - y0) / len : 0, ny = len ? (x1 - x0) / len : 0
    const minX = Math.floor(Math.min(x0, x1) - r), maxX = Math.ceil(Math.max(x0, x1) + r)
    const minY = Math.floor(Math.min(y0, y1) - r), maxY = Math.ceil(Math.max(y0, y1) + r)
    for (let py = minY; py <= maxY; py++) {
      for (let px = minX; px <= maxX; px++) {
        const t = len ? Math.max(0, Math.min(1, ((px - x0) * (x1 - x0) + (py - y0) * (y1 - y0)) / (len * len))) : 0
        const qx = x0 + t * (x1 - x0), qy = y0 + t * (y1 - y0)
        const d = Math.hypot(px - qx, py - qy)
        if (d > r) continue
        const side = ((px - qx) * nx + (py - qy) * ny) / r
        const col = opts.tube ? shade(c, 0.35 * -side - 0.25 * Math.abs(side) ** 3) : c
        this.put(px, py, col, (opts.alpha ?? 1) * Math.min(1, r - d + 0.5))
      }
    }
  }

  /** A thick polyline through the points. */
  path(points: [number, number][], width: number, c: Rgb, opts: { tube?: boolean, alpha?: number } = {}): void {
    for (let i = 1; i < points.length; i++) this.line(points[i - 1]![0], points[i - 1]![1], points[i]![0], points[i]![1], width, c, opts)
  }

  /** A filled convex or simple polygon (even-odd scanlines). */
  polygon(points: [number, number][], top: Rgb, bottom: Rgb = top): void {
    const ys = points.map(p => p[1])
    const minY = Math.max(0, Math.floor(Math.min(...ys))), maxY = Math.min(this.height - 1, Math.ceil(Math.max(...ys)))
    for (let y = minY; y <= maxY; y++) {
      const xs: number[] = []
      for (let i = 0; i < points.length; i++) {
        const [ax, ay] = points[i]!, [bx, by] = points[(i + 1) % points.length]!
        if ((ay <= y && by > y) || (by <= y && ay > y)) xs.push(ax + ((y - ay) / (by - ay)) * (bx - ax))
      }
      xs.sort((a, b) => a - b)
      const c = mix(top, bottom, (y - minY) / Math.max(1, maxY - minY))
      for (let k = 0; k + 1 < xs.length; k += 2) {
        for (let x = Math.max(0, Math.round(xs[k]!)); x < Math.min(this.width, Math.round(xs[k + 1]!)); x++) this.put(x, y, c)
      }
    }
  }

  /** Film grain and a soft vignette, so flat fills read as a photograph. */
  finish(seed: number, grain = 7, vignette = 0.28): void {
    const cx = this.width / 2, cy = this.height / 2, r2max = cx * cx + cy * cy
    const d = this.data
    let state = seed >>> 0 || 1
    for (let y = 0; y < this.height; y++) {
      const dy2 = (y - cy) * (y - cy)
      for (let x = 0; x < this.width; x++) {
        const i = (y * this.width + x) * 4
        const v = 1 - (vignette * ((x - cx) * (x - cx) + dy2)) / r2max
        // xorshift32: grain only, quality does not matter here.
        state ^= state << 13; state ^= state >>> 17; state ^= state << 5
        const n = ((state & 255) / 255 - 0.5) * grain
        d[i] = d[i]! * v + n
        d[i + 1] = d[i + 1]! * v + n
        d[i + 2] = d[i + 2]! * v + n
      }
    }
  }
}
