/**
 * One word per concept on screen, in notices, e-mails and certificates: a water-test session is
 * a "test" (what the trade and Tidewright's clients call it), never a "reading". Code keeps its
 * identifiers (`readings` table, `/api/tanks/:id/readings`, `ReadingView`); this test reads the
 * words a person sees: template text and prose string literals (with a space in them).
 * The engine's own texts (shared/cycle) are versioned with its rule set and are left out.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { describe, expect, it } from 'vitest'

const ROOT = join(__dirname, '../../..')
const SOURCES = ['app', 'server', 'shared']
const ENGINE = /^shared\/cycle\//
// Demo notes and server-only benchmark routes are not read by anyone through the product's screens.
const SKIP = /^server\/api\/bench\//

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name)
    return statSync(path).isDirectory() ? files(path) : /\.(vue|ts)$/.test(name) ? [path] : []
  })
}

/** The file without comments, and for a component without directive and binding expressions (code, not words). */
function withoutCode(text: string, vue: boolean): string {
  let out = text.replace(/\/\*[\s\S]*?\*\//g, ' ').replace(/<!--[\s\S]*?-->/g, ' ').replace(/(^|[^:'"`\w])\/\/.*$/gm, '$1')
  if (vue) {
    // An expression's quoted and backticked strings stay (they are shown); the rest of it is code.
    out = out.replace(/\s(?:[:@#]|v-)[\w.:-]*="([^"]*)"/g, (_, expression: string) => ` ${(expression.match(/'[^']*'|`[^`]*`/g) ?? []).join(' ')}`)
      .replace(/\{\{([^}]*)\}\}/g, (_, expression: string) => ` ${(expression.match(/'[^']*'|`[^`]*`/g) ?? []).join(' ')} `)
  }
  return out
}

/** Words a person reads: prose string literals, and for a component the text between its tags. */
function shownWords(text: string, vue: boolean): string[] {
  const code = withoutCode(text, vue)
  const literals = [...code.matchAll(/'((?:[^'\\\n]|\\.)*)'|`((?:[^`\\]|\\.)*)`|"((?:[^"\\\n]|\\.)*)"/g)]
    .map(m => m[1] ?? m[2] ?? m[3] ?? '')
  const template = vue ? [...(code.match(/<template>[\s\S]*<\/template>/)?.[0] ?? '').matchAll(/>([^<>]+)</g)].map(m => m[1] ?? '') : []
  return [...literals, ...template]
    .filter(w => /[a-z]/i.test(w) && /\s/.test(w.trim()))
    // SQL is code too (a statement, or a piece of one such as its joins).
    .filter(w => !/\b(INSERT INTO|SELECT|UPDATE \w+ SET|DELETE FROM)\b/.test(w) && !/\bselect\b[\s\S]*\bfrom\b/i.test(w) && !/\bjoin\b[\s\S]*\bon\b/i.test(w))
}

/** "reading" or "readings" used as a word, not as part of an identifier, property, JSON key or path. */
const READING_WORD = /(?<![\w./$-])[Rr]eadings?(?![\w/[(.-]|\.\w|"\s*:)/

describe('one word per concept', () => {
  it('calls a water-test session a "test" wherever a person reads it, never a "reading"', () => {
    const found: string[] = []
    for (const source of SOURCES) {
      for (const path of files(join(ROOT, source))) {
        const name = relative(ROOT, path)
        if (ENGINE.test(name) || SKIP.test(name)) continue
        for (const words of shownWords(readFileSync(path, 'utf8'), name.endsWith('.vue'))) {
          if (READING_WORD.test(words)) found.push(`${name}: ${words.trim().slice(0, 120)}`)
        }
      }
    }
    expect(found).toEqual([])
  })

  it('finds the other word where it is shown (the check can fail)', () => {
    const page = '<template>\n  <p>No readings yet.</p>\n  <ScrollTable :label="`Readings (${n})`" :rows="readings" />\n</template>'
    expect(shownWords(page, true).filter(w => READING_WORD.test(w)).sort()).toEqual(['No readings yet.', 'Readings (${n})'])
    expect(shownWords('const body = `A later reading cleared the alert.`', false).some(w => READING_WORD.test(w))).toBe(true)
    expect(shownWords('const rows = db.select().from(readings) // each reading\nfetch(`/api/tanks/${id}/readings`)', false).some(w => READING_WORD.test(w))).toBe(false)
    // A JSON key and a statement's joins are code; the word in quotes within prose is still found.
    expect(shownWords('const text = `{"readings": ${list}, "x": 1}`\nconst on = sql`left join ${readings} as later on ${a} = ${b}`', false).some(w => READING_WORD.test(w))).toBe(false)
    expect(shownWords('const hint = \'Open the "readings" list to see it.\'', false).some(w => READING_WORD.test(w))).toBe(true)
  })
})
