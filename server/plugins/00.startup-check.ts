// A real deployment refuses to start without its secrets; the demo (npm start) sets PULLSHEET_DEMO=1.
export default defineNitroPlugin(() => {
  if (import.meta.dev || import.meta.prerender || process.env.PULLSHEET_DEMO === '1') return
  const missing = missingProductionSettings()
  if (missing.length) {
    console.error(`Pullsheet will not start in production without: ${missing.join(', ')}. See README "Configuration".`)
    process.exit(1)
  }
})
