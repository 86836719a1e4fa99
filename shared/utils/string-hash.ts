/**
 * FNV-1a, 32 bits (Fowler, Noll, Vo; IETF draft-eastlake-fnv), as 7 base-36 digits: a
 * short name that depends only on the text. Not for security, only for stable ids.
 */
export function fnv1a32(text: string): number {
  let hash = 0x811C9DC5
  for (let i = 0; i < text.length; i++) {
    hash ^= text.charCodeAt(i)
    hash = Math.imul(hash, 0x01000193) >>> 0
  }
  return hash >>> 0
}

export const textHashName = (text: string): string => fnv1a32(text).toString(36).padStart(7, '0')
