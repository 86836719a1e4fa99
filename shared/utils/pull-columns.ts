// Words for the column roles of a pull file, for the column-mapping step.
import type { ColumnRole } from '../dyno/csv'

export const COLUMN_ROLE_LABELS: Record<ColumnRole, string> = {
  'rpm': 'Engine speed (rpm)',
  'torque-lb-ft': 'Torque in lb-ft',
  'torque-n-m': 'Torque in N-m',
  'power-hp': 'Power in hp',
  'power-kw': 'Power in kW',
  'power-ps': 'Power in PS',
  'vacuum-inhg': 'Manifold vacuum in inHg',
  'vacuum-kpa': 'Manifold vacuum in kPa',
  'afr': 'Air-fuel ratio',
  'extra': 'Keep as an extra channel',
  'ignore': 'Leave out',
}

/** The mapping with one header set to a role, or left to the reader when role is ''. */
export function withColumnRole(mapping: Record<string, ColumnRole>, header: string, role: ColumnRole | ''): Record<string, ColumnRole> {
  const next = Object.fromEntries(Object.entries(mapping).filter(([h]) => h !== header))
  if (role) next[header] = role
  return next
}
