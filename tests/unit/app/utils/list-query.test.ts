import { describe, expect, it } from 'vitest'
import { LIST_PAGE_SIZE, listQuery } from '~/utils/list-query'

describe('listQuery', () => {
  it('sends only the text filters that are set, with the page and the page size', () => {
    expect(listQuery({ q: '', role: 'client', status: '', page: 2 })).toEqual({ role: 'client', page: '2', pageSize: String(LIST_PAGE_SIZE) })
  })

  it('sends a yes/no filter whichever way it is set, so "not archived" is asked for, not implied', () => {
    expect(listQuery({ archived: false, page: 1 }, 5)).toEqual({ archived: 'false', page: '1', pageSize: '5' })
    expect(listQuery({ archived: true, page: 1 }, 5).archived).toBe('true')
  })

  it('takes the page size it is given over the usual one', () => {
    expect(listQuery({ page: 1 }, 25).pageSize).toBe('25')
    expect(listQuery({ page: 1 }).pageSize).toBe('20')
  })
})
