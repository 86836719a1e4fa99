// Text in an ECharts SVG turned into filled outlines of the print face, so the file
// looks the same in any layout program or renderer (resvg has no web fonts), with
// no font to install or license to pass on. fontkit shapes each label; its glyph
// outlines are placed where the <text> element would have put its text.
import type { Font } from 'fontkit'

const TEXT = /<text\b([^>]*)>([^<]*)<\/text>/g

function attr(attrs: string, name: string): string | undefined {
  return new RegExp(`\\s${name}="([^"]*)"`).exec(attrs)?.[1]
}

function styleValue(style: string | undefined, name: string): string | undefined {
  return style ? new RegExp(`(?:^|;)\\s*${name}\\s*:\\s*([^;]+)`).exec(style)?.[1]?.trim() : undefined
}

const ENTITIES: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: '\'' }

function unescapeXml(text: string): string {
  return text.replace(/&(#x[\da-f]+|#\d+|\w+);/gi, (whole, name: string) => {
    if (name[0] === '#') return String.fromCodePoint(name[1]?.toLowerCase() === 'x' ? Number.parseInt(name.slice(2), 16) : Number(name.slice(1)))
    return ENTITIES[name] ?? whole
  })
}

/** Where the baseline sits below the text's y, in font units, for each SVG dominant-baseline. */
function baselineShift(font: Font, baseline: string | undefined): number {
  switch (baseline) {
    case 'central':
    case 'middle': return (font.ascent + font.descent) / 2
    case 'hanging':
    case 'text-before-edge': return font.ascent
    case 'text-after-edge':
    case 'ideographic': return font.descent
    default: return 0
  }
}

const round = (n: number) => Math.round(n * 1000) / 1000

export function outlineSvgText(svg: string, fonts: { regular: Font, bold: Font }): string {
  return svg.replace(TEXT, (whole, attrs: string, content: string) => {
    const text = unescapeXml(content)
    if (!text.trim()) return ''
    const style = attr(attrs, 'style')
    const size = Number.parseFloat(styleValue(style, 'font-size') ?? attr(attrs, 'font-size') ?? '12')
    const weight = styleValue(style, 'font-weight') ?? attr(attrs, 'font-weight')
    const font = weight === 'bold' || Number(weight) >= 600 ? fonts.bold : fonts.regular
    const run = font.layout(text)
    let x = 0
    const d: string[] = []
    run.glyphs.forEach((glyph, i) => {
      const pos = run.positions[i]!
      d.push(glyph.path.translate(x + pos.xOffset, pos.yOffset).toSVG())
      x += pos.xAdvance
    })
    const scale = size / font.unitsPerEm
    const anchor = attr(attrs, 'text-anchor')
    const dx = anchor === 'middle' ? -x / 2 : anchor === 'end' ? -x : 0
    const left = Number(attr(attrs, 'x') ?? 0) + dx * scale
    const baseline = Number(attr(attrs, 'y') ?? 0) + baselineShift(font, attr(attrs, 'dominant-baseline')) * scale
    const transform = attr(attrs, 'transform')
    const fill = attr(attrs, 'fill') ?? styleValue(style, 'fill') ?? '#000'
    const placed = `${transform ? `${transform} ` : ''}translate(${round(left)} ${round(baseline)}) scale(${Number(scale.toPrecision(6))} ${-Number(scale.toPrecision(6))})`
    return `<path aria-label="${content.replace(/"/g, '&quot;')}" transform="${placed}" fill="${fill}" d="${d.join('')}"/>`
  })
}
