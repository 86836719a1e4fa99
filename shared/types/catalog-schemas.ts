import { z } from 'zod'
import { ENGINE_FAMILY_IDS, PART_TYPE_IDS } from './catalog'

export const EngineFamilySchema = z.enum(ENGINE_FAMILY_IDS)
export const PartTypeSchema = z.enum(PART_TYPE_IDS)
