/** The label of an id in one of the catalog's lists (shared/types/catalog.ts); the id itself when it is not there. */
export function labelOf(list: readonly { id: string, label: string }[], id: string): string {
  return list.find(item => item.id === id)?.label ?? id
}
