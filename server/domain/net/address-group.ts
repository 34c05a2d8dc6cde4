/**
 * One network, one key. An IPv6 host usually holds a whole /64, so counting single
 * addresses would let it rotate through 2^64 of them; IPv4 addresses count one by one.
 */
import { isIPv4, isIPv6 } from 'node:net'

/** The key a client address is counted under: the IPv4 address, or the IPv6 /64 prefix ("2001:db8:1:2::/64"). */
export function addressGroup(address: string | null | undefined): string {
  if (!address) return 'unknown'
  const bare = address.replace(/^\[|\]$/g, '').split('%')[0]!
  if (isIPv4(bare)) return bare
  if (!isIPv6(bare)) return 'unknown'
  const groups = expandIPv6(bare)
  // An IPv4-mapped address (::ffff:a.b.c.d, RFC 4291 section 2.5.5.2), in either text form, is one IPv4 host.
  if (groups.slice(0, 5).every(g => g === '0') && groups[5] === 'ffff') {
    const [high, low] = [Number.parseInt(groups[6]!, 16), Number.parseInt(groups[7]!, 16)]
    return [high >> 8, high & 255, low >> 8, low & 255].join('.')
  }
  return `${groups.slice(0, 4).join(':')}::/64`
}

/** The eight 16-bit groups of an IPv6 address, without leading zeros. */
function expandIPv6(address: string): string[] {
  let text = address.toLowerCase()
  // An embedded IPv4 tail ("::1.2.3.4") is two groups.
  const tail = /(\d+)\.(\d+)\.(\d+)\.(\d+)$/.exec(text)
  if (tail) {
    const [a, b, c, d] = tail.slice(1).map(Number) as [number, number, number, number]
    text = text.slice(0, tail.index) + `${((a << 8) | b).toString(16)}:${((c << 8) | d).toString(16)}`
  }
  const [head, rest] = text.split('::') as [string, string | undefined]
  const left = head ? head.split(':') : []
  const right = rest === undefined ? [] : rest ? rest.split(':') : []
  const fill = rest === undefined ? [] : Array(8 - left.length - right.length).fill('0')
  return [...left, ...fill, ...right].map(g => Number.parseInt(g || '0', 16).toString(16))
}
