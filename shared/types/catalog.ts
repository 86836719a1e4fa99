// No zod here: the reader's pages show these labels, and a zod schema built at a
// module's top level would come with them; the schemas are in ./catalog-schemas.ts.

/** Engine families readers browse by; our own list. */
export const ENGINE_FAMILIES = [
  { id: 'pushrod-v8', label: 'Pushrod V8' },
  { id: 'ohc-v8', label: 'Overhead-cam V8' },
  { id: 'ohc-four', label: 'Overhead-cam four' },
  { id: 'inline-six', label: 'Inline six' },
  { id: 'v6', label: 'V6' },
  { id: 'flat-four', label: 'Flat four' },
  { id: 'diesel', label: 'Diesel' },
  { id: 'other', label: 'Other' },
] as const
export type EngineFamily = typeof ENGINE_FAMILIES[number]['id']
export const ENGINE_FAMILY_IDS = ENGINE_FAMILIES.map(f => f.id) as [EngineFamily, ...EngineFamily[]]

/** What a bench test changes; our own list. */
export const PART_TYPES = [
  { id: 'camshaft', label: 'Camshaft' },
  { id: 'intake', label: 'Intake manifold' },
  { id: 'heads', label: 'Cylinder heads' },
  { id: 'exhaust', label: 'Exhaust and headers' },
  { id: 'induction', label: 'Carburetor and throttle body' },
  { id: 'ignition', label: 'Ignition and timing' },
  { id: 'forced-induction', label: 'Forced induction' },
  { id: 'fuel', label: 'Fuel' },
  { id: 'other', label: 'Other' },
] as const
export type PartType = typeof PART_TYPES[number]['id']
export const PART_TYPE_IDS = PART_TYPES.map(p => p.id) as [PartType, ...PartType[]]
