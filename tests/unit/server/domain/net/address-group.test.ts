import { describe, expect, it } from 'vitest'
import { addressGroup } from '../../../../../server/domain/net/address-group'

// RFC 4291 section 2.2 (text forms of IPv6 addresses) and RFC 6177 / RFC 7934 (an end
// site or host is normally given at least a /64): one /64 is one network.
describe('addressGroup', () => {
  it('counts every address of one IPv6 /64 as one network, whatever its text form', () => {
    const group = addressGroup('2001:db8:1:2::1')
    expect(group).toBe('2001:db8:1:2::/64')
    expect(addressGroup('2001:0db8:0001:0002:ffff:ffff:ffff:ffff')).toBe(group)
    expect(addressGroup('2001:DB8:1:2:abcd::7')).toBe(group)
    expect(addressGroup('[2001:db8:1:2::99]')).toBe(group)
    expect(addressGroup('fe80::1%eth0')).toBe('fe80:0:0:0::/64')
  })

  it('gives two hosts of one /64 one key, however their interface ids differ', () => {
    expect(addressGroup('2001:db8:1:2:aaaa::1')).toBe(addressGroup('2001:db8:1:2:bbbb::2'))
  })

  it('reads an IPv4-mapped address in either text form as its IPv4 address (RFC 4291 section 2.5.5.2)', () => {
    expect(addressGroup('::ffff:cb00:7107')).toBe('203.0.113.7')
    expect(addressGroup('0:0:0:0:0:FFFF:203.0.113.7')).toBe('203.0.113.7')
    expect(addressGroup('::ffff:cb00:7108')).not.toBe(addressGroup('::ffff:cb00:7107'))
  })

  it('keeps neighbouring /64s apart', () => {
    expect(addressGroup('2001:db8:1:3::1')).not.toBe(addressGroup('2001:db8:1:2::1'))
    expect(addressGroup('::1')).toBe('0:0:0:0::/64')
  })

  it('counts IPv4 addresses one by one, including IPv4-mapped IPv6', () => {
    expect(addressGroup('203.0.113.7')).toBe('203.0.113.7')
    expect(addressGroup('::ffff:203.0.113.7')).toBe('203.0.113.7')
    expect(addressGroup('203.0.113.8')).not.toBe(addressGroup('203.0.113.7'))
  })

  it('puts what is not an address under one key', () => {
    expect(addressGroup(undefined)).toBe('unknown')
    expect(addressGroup('not an address')).toBe('unknown')
  })
})
