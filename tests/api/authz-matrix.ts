// Who may call which API route, one entry per route file under server/api. The
// matrix test walks the route files and fails on any route without an entry here,
// so a new route cannot land without saying who may call it.
//
// 'ok' means the gate let the caller through: any answer but 401/403/404 and below
// 500 (an invalid body's 400 or a stale version's 409 still proves the gate passed).
// 'otherWriter' is a second writer calling the demo writer's objects (IDOR): 404.

export const CALLERS = ['anonymous', 'reader', 'otherWriter', 'writer', 'editor', 'admin'] as const
export type Caller = typeof CALLERS[number]
export type Expectation = 'ok' | 401 | 403 | 404
export type Expectations = Record<Caller, Expectation>

/** Ids of the objects the test arranged; everything is owned by the demo writer. */
export interface AuthzFixture {
  benchTestId: number
  setupId: number
  otherSetupId: number
  pullId: number
  checkId: number
  operatorLinkId: number
  uploadToken: string
  inboxFileId: number
  photoId: number
  photoWidth: number
  storyId: number
  storySlug: string
  storyVersion: number
  noteId: number
  previewLinkId: number
  previewToken: string
  revisionId: number
  spareUserId: number
  publicTag: string
}

/** Objects some callers use up (deleting, restoring, dismissing): a fresh one per call. */
export interface FreshObjects {
  deletedBenchTestId(): Promise<number>
  deletedSetupId(): Promise<number>
  idleCheckId(): Promise<number>
  inboxFileId(): Promise<number>
  photoId(): Promise<number>
}

export interface MatrixEntry {
  expect: Expectations
  path: (f: AuthzFixture) => string
  /** JSON body; for routes that validate the body before looking up ownership it must be valid. */
  body?: (f: AuthzFixture) => unknown
  /** For a caller that gets through, a path built on a fresh object (the route uses its object up). */
  freshPath?: (fresh: FreshObjects, f: AuthzFixture) => Promise<string>
  /** Runs after every other route (signing out ends the caller's sessions). */
  last?: boolean
}

const PUBLIC: Expectations = { anonymous: 'ok', reader: 'ok', otherWriter: 'ok', writer: 'ok', editor: 'ok', admin: 'ok' }
const SIGNED_IN: Expectations = { ...PUBLIC, anonymous: 401 }
const WRITERS: Expectations = { anonymous: 401, reader: 403, otherWriter: 'ok', writer: 'ok', editor: 'ok', admin: 'ok' }
const OWNER: Expectations = { ...WRITERS, otherWriter: 404 }
const EDITORS: Expectations = { anonymous: 401, reader: 403, otherWriter: 403, writer: 403, editor: 'ok', admin: 'ok' }
const ADMIN: Expectations = { ...EDITORS, editor: 403 }
/** A draft story's reader page: only its desk sees it; everyone else learns nothing. */
const DESK_ONLY: Expectations = { anonymous: 404, reader: 404, otherWriter: 404, writer: 'ok', editor: 'ok', admin: 'ok' }

const bt = (f: AuthzFixture) => `/api/bench-tests/${f.benchTestId}`
const st = (f: AuthzFixture) => `/api/stories/${f.storyId}`

export const AUTHZ_MATRIX: Record<string, MatrixEntry> = {
  'POST /api/admin/photos/sweep': { expect: ADMIN, path: () => '/api/admin/photos/sweep', body: () => ({ graceSeconds: 86400 }) },
  'POST /api/admin/housekeeping': { expect: ADMIN, path: () => '/api/admin/housekeeping', body: () => ({}) },
  'GET /api/admin/runtime': { expect: ADMIN, path: () => '/api/admin/runtime' },
  'POST /api/admin/runtime/reset': { expect: ADMIN, path: () => '/api/admin/runtime/reset' },
  'GET /api/admin/settings': { expect: ADMIN, path: () => '/api/admin/settings' },
  // Without a version the body is refused (400): the gate is proven, nothing changes.
  'PATCH /api/admin/settings': { expect: ADMIN, path: () => '/api/admin/settings', body: () => ({}) },

  'POST /api/auth/login': { expect: PUBLIC, path: () => '/api/auth/login', body: () => ({}) },
  'POST /api/auth/logout': { expect: PUBLIC, path: () => '/api/auth/logout', last: true },
  'GET /api/auth/me': { expect: PUBLIC, path: () => '/api/auth/me' },
  'POST /api/auth/password-reset/confirm': { expect: PUBLIC, path: () => '/api/auth/password-reset/confirm', body: () => ({}) },
  'POST /api/auth/password-reset': { expect: PUBLIC, path: () => '/api/auth/password-reset', body: () => ({}) },
  'PATCH /api/auth/password': { expect: SIGNED_IN, path: () => '/api/auth/password', body: () => ({}) },
  'POST /api/auth/register': { expect: PUBLIC, path: () => '/api/auth/register', body: () => ({}) },

  'GET /api/bench-tests': { expect: WRITERS, path: () => '/api/bench-tests' },
  'POST /api/bench-tests': { expect: WRITERS, path: () => '/api/bench-tests', body: () => ({}) },
  // With pulls and without ?confirm=true a delete only answers 409: nothing is used up.
  'DELETE /api/bench-tests/:id': { expect: OWNER, path: bt },
  'GET /api/bench-tests/:id': { expect: OWNER, path: bt },
  'PATCH /api/bench-tests/:id': { expect: OWNER, path: bt, body: () => ({}) },
  'GET /api/bench-tests/:id/analysis/csv': { expect: OWNER, path: f => `${bt(f)}/analysis/csv` },
  'GET /api/bench-tests/:id/analysis': { expect: OWNER, path: f => `${bt(f)}/analysis` },
  // Asked as JSON, the event stream answers 406 after the gate (it never streams to this test).
  'GET /api/bench-tests/:id/day/events': { expect: OWNER, path: f => `${bt(f)}/day/events` },
  'GET /api/bench-tests/:id/day': { expect: OWNER, path: f => `${bt(f)}/day` },
  'POST /api/bench-tests/:id/plan/copy': { expect: OWNER, path: f => `${bt(f)}/plan/copy`, body: () => ({}) },
  'POST /api/bench-tests/:id/plan/day': { expect: OWNER, path: f => `${bt(f)}/plan/day`, body: () => ({}) },
  'GET /api/bench-tests/:id/plan': { expect: OWNER, path: f => `${bt(f)}/plan` },
  'PUT /api/bench-tests/:id/plan': { expect: OWNER, path: f => `${bt(f)}/plan`, body: () => ({}) },
  'PUT /api/bench-tests/:id/build-sheet': { expect: OWNER, path: f => `${bt(f)}/build-sheet`, body: () => ({}) },
  'POST /api/bench-tests/:id/inbox/:fileId/dismiss': { expect: OWNER, path: f => `${bt(f)}/inbox/${f.inboxFileId}/dismiss`, freshPath: async (n, f) => `${bt(f)}/inbox/${await n.inboxFileId()}/dismiss` },
  'POST /api/bench-tests/:id/inbox/:fileId/preview': { expect: OWNER, path: f => `${bt(f)}/inbox/${f.inboxFileId}/preview` },
  'POST /api/bench-tests/:id/inbox/assign': { expect: OWNER, path: f => `${bt(f)}/inbox/assign`, body: () => ({}) },
  'GET /api/bench-tests/:id/inbox': { expect: OWNER, path: f => `${bt(f)}/inbox` },
  'POST /api/bench-tests/:id/operator-links/:linkId/revoke': { expect: OWNER, path: f => `${bt(f)}/operator-links/${f.operatorLinkId}/revoke` },
  'GET /api/bench-tests/:id/operator-links': { expect: OWNER, path: f => `${bt(f)}/operator-links` },
  'POST /api/bench-tests/:id/operator-links': { expect: OWNER, path: f => `${bt(f)}/operator-links`, body: () => ({ expiresInHours: 0 }) },
  'GET /api/bench-tests/:id/photos': { expect: OWNER, path: f => `${bt(f)}/photos` },
  'POST /api/bench-tests/:id/photos': { expect: OWNER, path: f => `${bt(f)}/photos`, body: () => ({}) },
  'GET /api/bench-tests/:id/pulls/:pullId': { expect: OWNER, path: f => `${bt(f)}/pulls/${f.pullId}` },
  'PATCH /api/bench-tests/:id/pulls/:pullId': { expect: OWNER, path: f => `${bt(f)}/pulls/${f.pullId}`, body: () => ({}) },
  'GET /api/bench-tests/:id/pulls/:pullId/file': { expect: OWNER, path: f => `${bt(f)}/pulls/${f.pullId}/file` },
  'POST /api/bench-tests/:id/pulls/import': { expect: OWNER, path: f => `${bt(f)}/pulls/import`, body: () => ({}) },
  'GET /api/bench-tests/:id/pulls': { expect: OWNER, path: f => `${bt(f)}/pulls` },
  'POST /api/bench-tests/:id/pulls/preview': { expect: OWNER, path: f => `${bt(f)}/pulls/preview`, body: () => ({}) },
  'POST /api/bench-tests/:id/restore': { expect: OWNER, path: f => `${bt(f)}/restore`, freshPath: async n => `/api/bench-tests/${await n.deletedBenchTestId()}/restore` },
  'DELETE /api/bench-tests/:id/setups/:setupId': { expect: OWNER, path: f => `${bt(f)}/setups/${f.setupId}` },
  'PATCH /api/bench-tests/:id/setups/:setupId': { expect: OWNER, path: f => `${bt(f)}/setups/${f.setupId}`, body: () => ({}) },
  'POST /api/bench-tests/:id/setups/:setupId/baseline': { expect: OWNER, path: f => `${bt(f)}/setups/${f.setupId}/baseline` },
  'DELETE /api/bench-tests/:id/setups/:setupId/idle-checks/:checkId': { expect: OWNER, path: f => `${bt(f)}/setups/${f.setupId}/idle-checks/${f.checkId}`, freshPath: async (n, f) => `${bt(f)}/setups/${f.setupId}/idle-checks/${await n.idleCheckId()}` },
  'POST /api/bench-tests/:id/setups/:setupId/idle-checks': { expect: OWNER, path: f => `${bt(f)}/setups/${f.setupId}/idle-checks`, body: () => ({}) },
  'POST /api/bench-tests/:id/setups/:setupId/restore': { expect: OWNER, path: f => `${bt(f)}/setups/${f.otherSetupId}/restore`, freshPath: async (n, f) => `${bt(f)}/setups/${await n.deletedSetupId()}/restore` },
  'GET /api/bench-tests/:id/setups': { expect: OWNER, path: f => `${bt(f)}/setups` },
  'POST /api/bench-tests/:id/setups': { expect: OWNER, path: f => `${bt(f)}/setups`, body: () => ({}) },
  'PUT /api/bench-tests/:id/setups/order': { expect: OWNER, path: f => `${bt(f)}/setups/order`, body: () => ({}) },

  'GET /api/desk/queue': { expect: EDITORS, path: () => '/api/desk/queue' },
  'GET /api/dev/mail': { expect: ADMIN, path: () => '/api/dev/mail' },
  'GET /api/health': { expect: PUBLIC, path: () => '/api/health' },

  'GET /api/magazine/engine/:family': { expect: PUBLIC, path: () => '/api/magazine/engine/pushrod-v8' },
  'GET /api/magazine/home': { expect: PUBLIC, path: () => '/api/magazine/home' },
  'GET /api/magazine/latest': { expect: PUBLIC, path: () => '/api/magazine/latest' },
  'GET /api/magazine/part/:type': { expect: PUBLIC, path: () => '/api/magazine/part/camshaft' },
  'GET /api/magazine/search': { expect: PUBLIC, path: () => '/api/magazine/search?q=cam' },
  'GET /api/magazine/stories/:slug': { expect: DESK_ONLY, path: f => `/api/magazine/stories/${f.storySlug}` },
  'GET /api/magazine/stories/:slug/analysis': { expect: DESK_ONLY, path: f => `/api/magazine/stories/${f.storySlug}/analysis` },
  'GET /api/magazine/stories/:slug/card.png': { expect: DESK_ONLY, path: f => `/api/magazine/stories/${f.storySlug}/card.png` },
  'GET /api/magazine/stories/:slug/data.csv': { expect: DESK_ONLY, path: f => `/api/magazine/stories/${f.storySlug}/data.csv` },
  'GET /api/magazine/stories/:slug/figures': { expect: DESK_ONLY, path: f => `/api/magazine/stories/${f.storySlug}/figures` },
  'GET /api/magazine/tags/:tag': { expect: PUBLIC, path: f => `/api/magazine/tags/${f.publicTag}` },

  'GET /api/my/stories': { expect: WRITERS, path: () => '/api/my/stories' },

  'DELETE /api/photos/:id': { expect: OWNER, path: f => `/api/photos/${f.photoId}`, freshPath: async n => `/api/photos/${await n.photoId()}` },
  'PATCH /api/photos/:id': { expect: OWNER, path: f => `/api/photos/${f.photoId}`, body: () => ({ version: 999_999, caption: 'Matrix caption' }) },
  'POST /api/photos/:id/retry': { expect: OWNER, path: f => `/api/photos/${f.photoId}/retry` },

  'GET /api/preferences': { expect: SIGNED_IN, path: () => '/api/preferences' },
  'PATCH /api/preferences': { expect: SIGNED_IN, path: () => '/api/preferences', body: () => ({}) },

  // The token is the credential: whoever holds it gets the same answer.
  'GET /api/pull-files/sample.csv': { expect: PUBLIC, path: () => '/api/pull-files/sample.csv' },
  'GET /api/preview/:token': { expect: PUBLIC, path: f => `/api/preview/${f.previewToken}` },
  'GET /api/preview/:token/photos/:photoId/:width': { expect: PUBLIC, path: f => `/api/preview/${f.previewToken}/photos/${f.photoId}/${f.photoWidth}` },

  'GET /api/stories': { expect: WRITERS, path: () => '/api/stories' },
  'POST /api/stories': { expect: WRITERS, path: () => '/api/stories', body: () => ({}) },
  'GET /api/stories/:id': { expect: OWNER, path: st },
  // These validate the body before the service looks up the story: valid bodies, stale versions.
  'PATCH /api/stories/:id': { expect: OWNER, path: st, body: () => ({ version: 999_999, autosave: true, deck: 'Matrix' }) },
  'GET /api/stories/:id/figures': { expect: OWNER, path: f => `${st(f)}/figures` },
  'GET /api/stories/:id/figures/:number/print': { expect: OWNER, path: f => `${st(f)}/figures/1/print?format=svg&columns=one` },
  'GET /api/stories/:id/edition': { expect: OWNER, path: f => `${st(f)}/edition` },
  'DELETE /api/stories/:id/lock': { expect: OWNER, path: f => `${st(f)}/lock` },
  'POST /api/stories/:id/lock': { expect: OWNER, path: f => `${st(f)}/lock`, body: () => ({}) },
  'PATCH /api/stories/:id/notes/:noteId': { expect: OWNER, path: f => `${st(f)}/notes/${f.noteId}`, body: () => ({ resolved: false }) },
  'GET /api/stories/:id/notes': { expect: OWNER, path: f => `${st(f)}/notes` },
  'POST /api/stories/:id/notes': { expect: OWNER, path: f => `${st(f)}/notes`, body: () => ({ body: 'A matrix note.' }) },
  'GET /api/stories/:id/number-check': { expect: OWNER, path: f => `${st(f)}/number-check` },
  'POST /api/stories/:id/preview-links/:linkId/revoke': { expect: OWNER, path: f => `${st(f)}/preview-links/${f.previewLinkId}/revoke` },
  'GET /api/stories/:id/print-package': { expect: OWNER, path: f => `${st(f)}/print-package` },
  'GET /api/stories/:id/preview-links': { expect: OWNER, path: f => `${st(f)}/preview-links` },
  'POST /api/stories/:id/preview-links': { expect: OWNER, path: f => `${st(f)}/preview-links`, body: () => ({ label: 'Matrix link' }) },
  'GET /api/stories/:id/revisions/:revisionId': { expect: OWNER, path: f => `${st(f)}/revisions/${f.revisionId}` },
  'POST /api/stories/:id/revisions/:revisionId/restore': { expect: OWNER, path: f => `${st(f)}/revisions/${f.revisionId}/restore`, body: () => ({ version: 999_999 }) },
  'GET /api/stories/:id/revisions/compare': { expect: OWNER, path: f => `${st(f)}/revisions/compare?from=${f.revisionId}&to=${f.revisionId}` },
  'GET /api/stories/:id/revisions': { expect: OWNER, path: f => `${st(f)}/revisions` },
  'GET /api/stories/:id/transitions': { expect: OWNER, path: f => `${st(f)}/transitions` },
  'POST /api/stories/:id/transitions': { expect: OWNER, path: f => `${st(f)}/transitions`, body: () => ({ action: 'submit', version: 999_999 }) },

  'GET /api/upload/:token': { expect: PUBLIC, path: f => `/api/upload/${f.uploadToken}` },
  'GET /api/upload/:token/plan': { expect: PUBLIC, path: f => `/api/upload/${f.uploadToken}/plan` },
  'POST /api/upload/:token': { expect: PUBLIC, path: f => `/api/upload/${f.uploadToken}`, body: () => ({}) },

  'PATCH /api/users/:id': { expect: ADMIN, path: f => `/api/users/${f.spareUserId}`, body: () => ({}) },
  'GET /api/users': { expect: ADMIN, path: () => '/api/users' },
  'POST /api/users': { expect: ADMIN, path: () => '/api/users', body: () => ({}) },
}

const METHODS = ['get', 'post', 'put', 'patch', 'delete'] as const

/** "server/api/bench-tests/[id]/pulls/[pullId].patch.ts" -> "PATCH /api/bench-tests/:id/pulls/:pullId". */
export function routeKey(relativeFile: string): string {
  const withoutExt = relativeFile.replace(/\.ts$/, '')
  const dot = withoutExt.lastIndexOf('.')
  const suffix = withoutExt.slice(dot + 1)
  const method = (METHODS as readonly string[]).includes(suffix) ? suffix.toUpperCase() : 'ANY'
  const route = (method === 'ANY' ? withoutExt : withoutExt.slice(0, dot))
    .split('/')
    .filter((segment, i, all) => !(segment === 'index' && i === all.length - 1))
    .map(segment => segment.replace(/^\[\.\.\.(\w+)\]$/, ':$1*').replace(/\[(\w+)\]/g, ':$1'))
    .join('/')
  return `${method} /api${route ? `/${route}` : ''}`
}
