// The print face (Merriweather, regular and bold, Latin) as bytes for pdfkit, which
// embeds a subset in each PDF, and as fontkit fonts for outlining SVG text. Shipped
// as Nitro server assets (nuxt.config.ts, `serverAssets`), so the built server has
// them without node_modules.
import * as fontkit from 'fontkit'
import { PRINT_FONT } from '#shared/figures/print-style'

export interface PrintFonts { regular: Buffer, bold: Buffer, outline: { regular: fontkit.Font, bold: fontkit.Font } }

let loading: Promise<PrintFonts> | undefined

async function asset(name: string): Promise<Buffer> {
  const raw = await useStorage('assets:print-fonts').getItemRaw<Buffer | Uint8Array>(name)
  if (!raw) throw new Error(`The print font ${name} is missing from the server's assets.`)
  return Buffer.from(raw as Uint8Array)
}

export function printFonts(): Promise<PrintFonts> {
  loading ??= (async () => {
    const [regular, bold] = await Promise.all([asset('merriweather-latin-400-normal.woff'), asset('merriweather-latin-700-normal.woff')])
    return { regular, bold, outline: { regular: fontkit.create(regular), bold: fontkit.create(bold) } }
  })().catch((error) => {
    loading = undefined
    throw error
  })
  return loading
}

export const PRINT_FONT_BOLD = `${PRINT_FONT} Bold`
