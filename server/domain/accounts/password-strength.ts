/**
 * Whether a new password is too easy to guess, judged by zxcvbn-ts (a maintained port of
 * Dropbox's zxcvbn estimator) against common passwords, English words and names, keyboard
 * patterns, repeats and dates, and against words of the person's own context: the product
 * name, their e-mail address and its parts, their name and their company's. Every path that
 * sets a password calls this (the shared schema checks length first).
 */
import type { ZxcvbnFactory } from '@zxcvbn-ts/core'

/** zxcvbn's 0-4 scale; 3 is "safely unguessable: moderate protection from offline slow-hash attacks". */
const MIN_SCORE = 3
const PRODUCT_WORDS = ['tidewright', 'tide', 'wright', 'reef', 'aquarium', 'aquarist']

let estimator: Promise<ZxcvbnFactory> | undefined

/** The dictionaries take a few seconds to load: once per process, on first use. */
function loadEstimator(): Promise<ZxcvbnFactory> {
  estimator ??= (async () => {
    const [{ ZxcvbnFactory }, common, en] = await Promise.all([import('@zxcvbn-ts/core'), import('@zxcvbn-ts/language-common'), import('@zxcvbn-ts/language-en')])
    return new ZxcvbnFactory({
      dictionary: { ...common.dictionary, ...en.dictionary },
      graphs: common.adjacencyGraphs,
      translations: en.translations,
      useLevenshteinDistance: true,
    })
  })()
  return estimator
}

/** The words of a person's context a password must not lean on. */
export function contextWords(person: { email: string, name?: string | null, company?: string | null }): string[] {
  const email = person.email.trim().toLowerCase()
  const [local = '', domain = ''] = email.split('@')
  return [
    ...PRODUCT_WORDS, email, local, domain, ...local.split(/[._+-]+/), ...domain.split('.'),
    ...(person.name ?? '').toLowerCase().split(/\s+/), ...(person.company ?? '').toLowerCase().split(/\s+/),
  ].filter(word => word.length >= 3)
}

/** A message that helps, or null when the password is strong enough. */
export async function passwordWeakness(password: string, person: { email: string, name?: string | null, company?: string | null }): Promise<string | null> {
  const result = (await loadEstimator()).check(password, contextWords(person))
  if (result.score >= MIN_SCORE) return null
  const why = result.feedback.warning ? `${result.feedback.warning.replace(/\.$/, '')}. ` : ''
  const how = result.feedback.suggestions.length ? result.feedback.suggestions.join(' ') : 'Add more words that are less common.'
  return `This password is too easy to guess. ${why}${how} A few unrelated words with a number in between work well.`
}
