import { magazineHome } from '~~/server/services/magazine/lists'
// The front page: the featured story, the latest, and what there is to browse.
export default defineEventHandler(() => magazineHome(useDb()))
