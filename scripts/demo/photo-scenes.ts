// The demo's photographs, drawn: an engine on its stand in the dyno cell, the parts
// on a workbench, the pulls on the dyno computer's screen. In the site's palette
// (tailwind.config.ts), with no lettering, marks or brands. Seeded, so every run
// draws the same pictures.
import { Jimp } from 'jimp'
import { mulberry32, modelTorqueLbFt, type TorqueModel } from '../../shared/dyno/index'
import { Canvas, hex, mix, shade, type Rgb } from './canvas'

const C = {
  paper: hex('#faf7f2'), deep: hex('#f1ebe1'), edge: hex('#e2d9cb'),
  ink: hex('#1f2328'), soft: hex('#4a5058'), faint: hex('#6b7078'),
  signal: hex('#c2410c'), signalDark: hex('#9a3412'), signalLight: hex('#fed7aa'),
  gauge: hex('#0f5e66'), gaugeDark: hex('#0b454b'), gaugeLight: hex('#d5ecee'),
  caution: hex('#e9c46a'), steel: hex('#9aa1a8'), alloy: hex('#c9ccd0'), wood: hex('#b98a5a'),
}

export type PartShape = 'camshaft' | 'intake' | 'headers' | 'carburetor' | 'throttle-body' | 'heads' | 'distributor' | 'intercooler' | 'downpipe' | 'regulator'

export type PhotoScene
  = | { kind: 'engine', cylinders: number, layout: 'v' | 'inline' | 'flat', accent: 'signal' | 'gauge', seed: number }
    | { kind: 'bench', part: PartShape, count: number, seed: number }
    | { kind: 'screen', models: TorqueModel[], fromRpm: number, toRpm: number, seed: number }

function cellBackground(c: Canvas, random: () => number): number {
  const floorY = Math.round(c.height * 0.7)
  c.rect(0, 0, c.width, floorY, shade(C.soft, -0.35), shade(C.soft, 0.05))
  // Acoustic wall panels and a service duct along the top.
  const panel = Math.round(c.width / 7)
  for (let x = 0; x < c.width; x += panel) c.rect(x, 0, 3, floorY, shade(C.ink, 0.05), shade(C.ink, 0.1), 0.6)
  c.rect(0, c.height * 0.06, c.width, c.height * 0.05, shade(C.steel, -0.2), shade(C.steel, -0.45))
  c.rect(0, floorY, c.width, c.height - floorY, shade(C.faint, -0.25), shade(C.ink, 0.05))
  // Yellow safety line on the floor.
  c.rect(0, floorY + (c.height - floorY) * 0.55, c.width, c.height * 0.018, C.caution, shade(C.caution, -0.2), 0.85)
  // A work light's pool on the floor.
  c.ellipse(c.width * (0.4 + 0.2 * random()), floorY + (c.height - floorY) * 0.35, c.width * 0.35, (c.height - floorY) * 0.3, C.paper, { alpha: 0.08 })
  return floorY
}

function engineOnStand(c: Canvas, s: Extract<PhotoScene, { kind: 'engine' }>): void {
  const random = mulberry32(s.seed)
  const floorY = cellBackground(c, random)
  const W = c.width, H = c.height
  const cx = W * (0.46 + 0.08 * random()), baseY = floorY + H * 0.1
  const accent = s.accent === 'signal' ? C.signal : C.gauge
  // Stand: legs, post and casters.
  c.line(cx - W * 0.2, baseY + H * 0.05, cx + W * 0.2, baseY + H * 0.05, H * 0.03, shade(C.signal, -0.1), { tube: true })
  c.line(cx - W * 0.05, baseY - H * 0.02, cx - W * 0.05, H * 0.5, H * 0.035, shade(C.signal, -0.1), { tube: true })
  for (const dx of [-0.19, 0.19]) c.circle(cx + W * dx, baseY + H * 0.085, H * 0.025, C.ink, { lit: true })
  // Block and oil pan.
  const blockW = W * (s.layout === 'inline' ? 0.3 : 0.26), blockH = H * 0.22
  const bx = cx - blockW / 2, by = H * 0.36
  c.rect(bx, by + blockH, blockW, H * 0.09, shade(C.steel, -0.25), shade(C.steel, -0.5))
  c.rect(bx, by, blockW, blockH, shade(C.gauge, 0.15), shade(C.gaugeDark, -0.2))
  // Cylinder banks and covers.
  const covers = s.layout === 'v' ? [-1, 1] : s.layout === 'flat' ? [-2, 2] : [0]
  for (const side of covers) {
    if (s.layout === 'inline') {
      c.rect(bx - W * 0.01, by - H * 0.13, blockW + W * 0.02, H * 0.13, shade(C.gauge, 0.1), C.gaugeDark)
      c.rect(bx + W * 0.01, by - H * 0.2, blockW - W * 0.02, H * 0.075, shade(accent, 0.15), shade(accent, -0.25))
      continue
    }
    const tilt = side * (s.layout === 'flat' ? 0.45 : 0.16)
    const topX = cx + W * 0.09 * side * (s.layout === 'flat' ? 1.4 : 1)
    c.polygon([[cx, by + H * 0.02], [cx + blockW * 0.5 * Math.sign(side), by + H * 0.02], [topX + W * tilt * 0.25, by - H * 0.18], [topX - W * 0.03 * Math.sign(side), by - H * 0.2]], shade(C.gauge, 0.1), C.gaugeDark)
    c.line(topX - W * 0.055, by - H * 0.21, topX + W * 0.055 * Math.sign(side) * 0.6, by - H * 0.19, H * 0.06, accent, { tube: true })
  }
  // Intake and carburetor or throttle on top, between the banks.
  if (s.layout === 'v') {
    c.rect(cx - W * 0.06, by - H * 0.12, W * 0.12, H * 0.1, shade(C.alloy, 0.1), shade(C.alloy, -0.3))
    c.ellipse(cx, by - H * 0.15, W * 0.07, H * 0.035, shade(C.steel, -0.1), { lit: true })
  }
  // Crank pulley, water pump, belt at the front (left).
  const px = bx - W * 0.015, py = by + blockH * 0.7
  c.circle(px, py, H * 0.07, C.ink, { lit: true })
  c.circle(px, py, H * 0.05, C.steel, { lit: true })
  c.circle(px + W * 0.01, py - H * 0.13, H * 0.04, C.alloy, { lit: true })
  c.line(px - H * 0.07, py, px - H * 0.04 + W * 0.01, py - H * 0.13, H * 0.012, C.ink)
  // Headers sweeping down from the banks.
  const tubes = Math.min(4, Math.ceil(s.cylinders / 2))
  for (let i = 0; i < tubes; i++) {
    const x0 = bx + blockW * (0.25 + i * 0.17)
    c.path([[x0, by + H * 0.03], [x0 - W * 0.01, by + H * 0.16], [x0 + W * 0.02, by + H * 0.25], [cx + W * 0.02, by + H * 0.31]], H * 0.022, shade(C.steel, 0.1), { tube: true })
  }
  // Flywheel at the back (right) and the dyno's coupling shaft.
  c.ellipse(bx + blockW + W * 0.01, by + blockH * 0.6, W * 0.02, H * 0.13, shade(C.steel, -0.1), { lit: true })
  c.line(bx + blockW + W * 0.02, by + blockH * 0.6, W * 0.98, by + blockH * 0.6, H * 0.04, C.steel, { tube: true })
  c.rect(W * 0.86, by - H * 0.05, W * 0.14, H * 0.3, shade(C.gauge, -0.1), C.gaugeDark)
  c.finish(s.seed)
}

function bench(c: Canvas, s: Extract<PhotoScene, { kind: 'bench' }>): void {
  const random = mulberry32(s.seed)
  const W = c.width, H = c.height
  const topY = Math.round(H * 0.42)
  // Pegboard wall and a hanging tool.
  c.rect(0, 0, W, topY, shade(C.deep, -0.05), shade(C.edge, -0.12))
  for (let y = H * 0.04; y < topY; y += H * 0.045) for (let x = W * 0.02; x < W; x += H * 0.045) c.circle(x, y, H * 0.004, shade(C.edge, -0.35))
  c.line(W * 0.78, H * 0.06, W * 0.84, H * 0.32, H * 0.02, C.steel, { tube: true })
  c.circle(W * 0.78, H * 0.06, H * 0.025, C.steel, { lit: true })
  // Bench top with grain.
  c.rect(0, topY, W, H - topY, shade(C.wood, 0.1), shade(C.wood, -0.35))
  for (let i = 0; i < 26; i++) {
    const y = topY + random() * (H - topY)
    c.rect(0, y, W, 1 + random() * 2, shade(C.wood, -0.25), shade(C.wood, -0.25), 0.35)
  }
  c.rect(0, topY, W, H * 0.015, shade(C.wood, 0.3))
  for (let n = 0; n < s.count; n++) {
    // Long parts lie one above the other, the rest side by side.
    const long = s.part === 'camshaft'
    const spread = s.count === 1 ? 0.5 : n / (s.count - 1)
    const ox = long ? W * (0.5 + 0.03 * n) : W * (s.count === 1 ? 0.5 : 0.28 + 0.44 * spread)
    const oy = long ? topY + (H - topY) * (s.count === 1 ? 0.45 : 0.25 + 0.45 * spread) : topY + (H - topY) * (0.45 + 0.1 * (n % 2))
    drawPart(c, s.part, ox, oy, long ? W * 0.9 : W / (s.count === 1 ? 1 : 1.25), H, random)
  }
  // A blank parts tag and a rag: no lettering on either.
  c.polygon([[W * 0.08, H * 0.88], [W * 0.16, H * 0.86], [W * 0.17, H * 0.92], [W * 0.09, H * 0.94]], C.paper, C.deep)
  c.ellipse(W * 0.9, H * 0.9, W * 0.07, H * 0.04, C.signalLight, { lit: true, alpha: 0.9 })
  c.finish(s.seed)
}

function drawPart(c: Canvas, part: PartShape, x: number, y: number, W: number, H: number, random: () => number): void {
  const shadow = (w: number) => c.ellipse(x, y + H * 0.06, w, H * 0.03, C.ink, { alpha: 0.25 })
  switch (part) {
    case 'camshaft': {
      shadow(W * 0.3)
      c.line(x - W * 0.3, y, x + W * 0.3, y, H * 0.025, C.alloy, { tube: true })
      for (let i = 0; i < 16; i++) {
        const lx = x - W * 0.27 + (i * W * 0.54) / 15
        c.ellipse(lx, y - H * 0.008 * (i % 2 ? 1 : -1), W * 0.008, H * 0.035, shade(C.steel, 0.05), { lit: true })
      }
      c.circle(x - W * 0.31, y, H * 0.04, shade(C.steel, -0.1), { lit: true })
      break
    }
    case 'intake': {
      shadow(W * 0.2)
      c.rect(x - W * 0.17, y - H * 0.1, W * 0.34, H * 0.14, shade(C.alloy, 0.15), shade(C.alloy, -0.35))
      for (let i = 0; i < 4; i++) c.line(x - W * 0.15 + i * W * 0.1, y - H * 0.08, x - W * 0.19 + i * W * 0.12, y + H * 0.05, H * 0.05, C.alloy, { tube: true })
      c.rect(x - W * 0.05, y - H * 0.15, W * 0.1, H * 0.06, shade(C.alloy, 0.25), C.alloy)
      break
    }
    case 'headers':
    case 'downpipe': {
      shadow(W * 0.22)
      const tubes = part === 'headers' ? 4 : 1
      for (let i = 0; i < tubes; i++) {
        const off = i * H * 0.035
        c.path([[x - W * 0.22, y - H * 0.12 + off], [x - W * 0.1, y - H * 0.14 + off], [x, y - H * 0.05 + off], [x + W * 0.08, y + off * 0.3], [x + W * 0.2, y]], H * (tubes > 1 ? 0.03 : 0.065), shade(C.steel, 0.15 - i * 0.05), { tube: true })
      }
      c.rect(x - W * 0.24, y - H * 0.17, W * 0.03, H * 0.17, shade(C.steel, -0.1), shade(C.steel, -0.4))
      break
    }
    case 'carburetor': {
      shadow(W * 0.1)
      c.rect(x - W * 0.08, y - H * 0.14, W * 0.16, H * 0.16, shade(C.alloy, 0.2), shade(C.alloy, -0.3))
      for (const dx of [-0.035, 0.035]) for (const dy of [-0.1, -0.04]) c.circle(x + W * dx, y + H * dy, H * 0.022, C.ink, { lit: true })
      c.rect(x - W * 0.1, y + H * 0.01, W * 0.2, H * 0.02, shade(C.steel, -0.3))
      break
    }
    case 'throttle-body': {
      shadow(W * 0.09)
      c.circle(x, y - H * 0.06, H * 0.11, shade(C.alloy, 0.05), { lit: true })
      c.circle(x, y - H * 0.06, H * 0.08, C.ink, { lit: true })
      c.line(x - H * 0.075, y - H * 0.03, x + H * 0.075, y - H * 0.09, H * 0.012, C.steel)
      break
    }
    case 'heads': {
      shadow(W * 0.22)
      c.rect(x - W * 0.22, y - H * 0.09, W * 0.44, H * 0.13, shade(C.alloy, 0.1), shade(C.alloy, -0.4))
      for (let i = 0; i < 4; i++) c.ellipse(x - W * 0.15 + i * W * 0.1, y - H * 0.03, W * 0.03, H * 0.035, shade(C.ink, 0.1), { lit: true })
      break
    }
    case 'distributor': {
      shadow(W * 0.06)
      c.line(x, y - H * 0.02, x, y + H * 0.05, W * 0.02, C.steel, { tube: true })
      c.ellipse(x, y - H * 0.07, W * 0.055, H * 0.06, shade(C.signal, -0.1), { lit: true })
      for (let i = 0; i < 6; i++) {
        const a = Math.PI * (0.1 + (i * 0.8) / 5)
        c.path([[x - Math.cos(a) * W * 0.04, y - H * 0.1], [x - Math.cos(a) * W * 0.12, y - H * (0.16 + random() * 0.05)]], H * 0.01, C.ink)
      }
      break
    }
    case 'intercooler': {
      shadow(W * 0.24)
      c.rect(x - W * 0.22, y - H * 0.16, W * 0.44, H * 0.2, shade(C.steel, 0.05), shade(C.steel, -0.35))
      for (let i = 0; i < 40; i++) c.rect(x - W * 0.2 + (i * W * 0.4) / 40, y - H * 0.15, 2, H * 0.18, shade(C.ink, 0.2), shade(C.ink, 0.2), 0.5)
      for (const dx of [-0.24, 0.24]) c.rect(x + W * dx - W * 0.02, y - H * 0.17, W * 0.04, H * 0.22, C.alloy, shade(C.alloy, -0.3))
      break
    }
    case 'regulator': {
      shadow(W * 0.05)
      c.rect(x - W * 0.035, y - H * 0.12, W * 0.07, H * 0.12, shade(C.gauge, 0.2), C.gaugeDark)
      c.circle(x, y - H * 0.16, H * 0.045, C.alloy, { lit: true })
      c.circle(x, y - H * 0.16, H * 0.03, C.paper)
      c.line(x, y - H * 0.16, x + H * 0.02, y - H * 0.175, 3, C.signal)
      break
    }
  }
}

function screen(c: Canvas, s: Extract<PhotoScene, { kind: 'screen' }>): void {
  const W = c.width, H = c.height
  // Control room: dark wall, desk, monitor.
  c.rect(0, 0, W, H * 0.78, shade(C.ink, 0.08), C.ink)
  c.rect(0, H * 0.78, W, H * 0.22, shade(C.edge, -0.45), shade(C.edge, -0.65))
  c.rect(W * 0.44, H * 0.74, W * 0.12, H * 0.05, C.soft)
  const sx = W * 0.1, sy = H * 0.08, sw = W * 0.8, sh = H * 0.62
  c.rect(sx - W * 0.015, sy - W * 0.015, sw + W * 0.03, sh + W * 0.03, shade(C.ink, -0.3))
  c.rect(sx, sy, sw, sh, shade(C.ink, 0.12), shade(C.ink, 0.02))
  // Grid.
  for (let i = 1; i < 8; i++) c.rect(sx + (sw * i) / 8, sy, 1, sh, C.faint, C.faint, 0.5)
  for (let i = 1; i < 6; i++) c.rect(sx, sy + (sh * i) / 6, sw, 1, C.faint, C.faint, 0.5)
  // Curves: power of each model, the first in teal, the others in warm tones.
  const colours: Rgb[] = [C.gaugeLight, C.signal, C.signalLight, C.caution]
  const power = (m: TorqueModel, r: number) => (modelTorqueLbFt(m, r) * r) / 5252.113
  const samples = 80
  let maxPower = 0
  for (const m of s.models) for (let i = 0; i <= samples; i++) maxPower = Math.max(maxPower, power(m, s.fromRpm + ((s.toRpm - s.fromRpm) * i) / samples))
  for (const [k, m] of s.models.entries()) {
    const pts: [number, number][] = []
    const torque: [number, number][] = []
    for (let i = 0; i <= samples; i++) {
      const r = s.fromRpm + ((s.toRpm - s.fromRpm) * i) / samples
      pts.push([sx + (sw * i) / samples, sy + sh * (1 - 0.88 * power(m, r) / maxPower)])
      torque.push([sx + (sw * i) / samples, sy + sh * (1 - 0.88 * (modelTorqueLbFt(m, r) * 0.9) / maxPower)])
    }
    const colour = colours[k % colours.length]!
    c.path(pts, H * 0.008, colour)
    c.path(torque, H * 0.005, mix(colour, C.ink, 0.35))
  }
  // The keyboard.
  c.rect(W * 0.3, H * 0.85, W * 0.4, H * 0.06, shade(C.ink, 0.15), shade(C.ink, 0.05))
  c.finish(s.seed, 6, 0.35)
}

/**
 * Draws a scene and returns it as a PNG: several times quicker to encode here and to
 * decode in the photo job than a JPEG from jimp's pure-JS codec, and the job makes
 * the JPEG web sizes anyway.
 */
export async function drawPhoto(scene: PhotoScene, width: number, height: number): Promise<Buffer> {
  const canvas = new Canvas(width, height)
  if (scene.kind === 'engine') engineOnStand(canvas, scene)
  else if (scene.kind === 'bench') bench(canvas, scene)
  else screen(canvas, scene)
  const image = Jimp.fromBitmap({ data: canvas.data, width, height })
  // Lossless either way; unfiltered rows with zlib's default strategy encode in a
  // quarter of the time of jimp's defaults (adaptive filters, run-length strategy:
  // two thirds of the seed's own drawing time) and come out smaller.
  return image.getBuffer('image/png', { deflateLevel: 1, filterType: 0, deflateStrategy: 0 })
}
