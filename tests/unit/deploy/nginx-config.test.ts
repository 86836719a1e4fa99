// deploy/nginx/pullsheet.conf reduces Accept-Encoding to br, gzip or nothing with a map.
// The wordings browsers send are listed as exact strings, found in the map's hash so that
// a cached page's hit runs no regular expression; the expressions under them answer every
// other wording. The exact entries must give what the expressions would give, or the
// cache would keep a page under one encoding and send the bytes of another.
// nginx's map (ngx_http_map_find): the value, lowercased, is looked up among the exact
// strings first; then the expressions are tried in order ("~*" case-insensitive); then
// the default. JavaScript's \b is PCRE's for these ASCII headers.
import { spawnSync } from 'node:child_process'
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'

interface NginxMap { defaultValue: string, exact: Map<string, string>, patterns: { re: RegExp, value: string }[] }

const shipped = () => readFileSync(new URL('../../../deploy/nginx/pullsheet.conf', import.meta.url), 'utf8')

function readMap(variable: string): NginxMap {
  const conf = shipped()
  const block = new RegExp(`map \\$http_accept_encoding \\${variable} \\{([\\s\\S]*?)\\n\\}`).exec(conf)
  if (!block) throw new Error(`no map for ${variable} in pullsheet.conf`)
  const map: NginxMap = { defaultValue: '', exact: new Map(), patterns: [] }
  for (const line of block[1]!.split('\n')) {
    const entry = /^\s*(?:"([^"]*)"|(\S+))\s+(?:"([^"]*)"|([^;\s]+))\s*;/.exec(line)
    if (!entry) continue
    const key = entry[1] ?? entry[2]!
    const value = entry[3] ?? entry[4]!
    if (key === 'default' && entry[2]) map.defaultValue = value
    else if (key.startsWith('~*')) map.patterns.push({ re: new RegExp(key.slice(2), 'i'), value })
    else if (key.startsWith('~')) map.patterns.push({ re: new RegExp(key.slice(1)), value })
    else map.exact.set(key.toLowerCase(), value)
  }
  return map
}

const byPatterns = (map: NginxMap, header: string) => map.patterns.find(p => p.re.test(header))?.value ?? map.defaultValue
const lookup = (map: NginxMap, header: string) => map.exact.get(header.toLowerCase()) ?? byPatterns(map, header)

describe('pullsheet.conf, the Accept-Encoding map', () => {
  const map = readMap('$pullsheet_encoding')

  it('lists the wordings of today\'s browsers as exact strings', () => {
    expect(map.exact.get('gzip, deflate, br, zstd')).toBe('br')
    expect(map.exact.get('gzip, deflate, br')).toBe('br')
    expect(map.exact.get('gzip, deflate')).toBe('gzip')
  })

  it('gives for every exact string what its regular expressions give', () => {
    expect(map.exact.size).toBeGreaterThan(0)
    for (const [wording, value] of map.exact) expect({ wording, value }).toEqual({ wording, value: byPatterns(map, wording) })
  })

  it('answers other wordings by the expressions: Brotli first, then gzip, else none', () => {
    expect(lookup(map, 'br;q=1.0, gzip;q=0.8, *;q=0.1')).toBe('br')
    expect(lookup(map, 'deflate, gzip, br, zstd')).toBe('br')
    expect(lookup(map, 'GZIP, Deflate')).toBe('gzip')
    expect(lookup(map, 'brotli, gzipped')).toBe('')
    expect(lookup(map, 'identity')).toBe('')
    expect(lookup(map, '')).toBe('')
  })
})

// The whole file as Debian's nginx reads it from conf.d (inside http {}), with a throwaway
// certificate and the paths moved into a temporary folder. Where nginx or openssl is not
// installed there is nothing to check it against.
const installed = (command: string, versionArg: string) => spawnSync(command, [versionArg], { stdio: 'ignore' }).status === 0

describe.runIf(installed('nginx', '-v') && installed('openssl', 'version'))('pullsheet.conf in the nginx installed here', () => {
  it('passes nginx -t, with pcre_jit on in the main context as docs/deploy/nginx.md has it', () => {
    const dir = mkdtempSync(join(tmpdir(), 'pullsheet-nginx-'))
    try {
      const cert = spawnSync('openssl', ['req', '-x509', '-newkey', 'rsa:2048', '-nodes', '-days', '1', '-subj', '/CN=magazine.example', '-keyout', join(dir, 'key.pem'), '-out', join(dir, 'cert.pem')], { encoding: 'utf8' })
      expect(cert.status, cert.stderr).toBe(0)
      writeFileSync(join(dir, 'pullsheet.conf'), shipped()
        .replace('/etc/ssl/certs/magazine.example.pem', join(dir, 'cert.pem'))
        .replace('/etc/ssl/private/magazine.example.key', join(dir, 'key.pem'))
        .replace('/var/cache/nginx/pullsheet', join(dir, 'cache'))
        .replace('/var/log/nginx/pullsheet.access.log', join(dir, 'access.log')))
      writeFileSync(join(dir, 'nginx.conf'), `pcre_jit on;
pid ${dir}/nginx.pid;
error_log ${dir}/error.log;
events {}
http {
  include ${dir}/pullsheet.conf;
}
`)
      const check = spawnSync('nginx', ['-t', '-q', '-p', dir, '-e', join(dir, 'error.log'), '-c', join(dir, 'nginx.conf')], { encoding: 'utf8' })
      expect(check.status, check.stderr).toBe(0)
    }
    finally {
      rmSync(dir, { recursive: true, force: true })
    }
  })
})
