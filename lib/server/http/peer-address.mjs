// The client's address as the product may believe it (plain JavaScript: the HTTP server loads it before Next).
import { BlockList, isIP } from "node:net";

/**
 * Parse TRUSTED_PROXIES ("10.0.0.5, 192.168.0.0/24, ::1") into a BlockList. Throws a message naming the
 * entry that is not an address or a CIDR range.
 * @param {string | undefined} text
 * @returns {BlockList}
 */
export function trustedProxyList(text) {
  const list = new BlockList();
  for (const raw of (text ?? "").split(",")) {
    const entry = raw.trim();
    if (!entry) continue;
    const [address, bits] = entry.split("/");
    const family = isIP(address);
    if (!family) throw new Error(`TRUSTED_PROXIES: "${entry}" is not an IP address or CIDR range.`);
    const type = family === 6 ? "ipv6" : "ipv4";
    if (bits === undefined) list.addAddress(address, type);
    else {
      const prefix = Number(bits);
      if (!Number.isInteger(prefix) || prefix < 0 || prefix > (family === 6 ? 128 : 32))
        throw new Error(`TRUSTED_PROXIES: "${entry}" has an invalid prefix length.`);
      list.addSubnet(address, prefix, type);
    }
  }
  return list;
}

/** "::ffff:127.0.0.1" → "127.0.0.1", so IPv4 clients on a dual-stack socket match IPv4 ranges. */
function plain(address) {
  return address.startsWith("::ffff:") && isIP(address.slice(7)) === 4 ? address.slice(7) : address;
}

/**
 * The X-Forwarded-For value to pass on. A header sent by the client itself is dropped unless the
 * connection comes from a trusted proxy, which appended the real client's address (RFC 7239 §5.2 for
 * the same idea in the Forwarded header); the socket's own address always ends the chain, so the
 * sign-in rate limit, reading the chain from the right past trusted proxies, counts real addresses.
 * @param {string | undefined} peer the socket's remote address
 * @param {string | string[] | undefined} forwardedFor the header as received
 * @param {BlockList} trusted
 * @returns {string | undefined}
 */
export function forwardedForToPass(peer, forwardedFor, trusted) {
  if (!peer) return undefined;
  const socket = plain(peer);
  const received = Array.isArray(forwardedFor) ? forwardedFor.join(", ") : forwardedFor;
  return isTrustedPeer(peer, trusted) && received ? `${received}, ${socket}` : socket;
}

/**
 * Whether the socket's remote address is one of the configured proxies.
 * @param {string | undefined} peer
 * @param {BlockList} trusted
 */
export function isTrustedPeer(peer, trusted) {
  if (!peer) return false;
  const socket = plain(peer);
  const family = isIP(socket);
  return family !== 0 && trusted.check(socket, family === 6 ? "ipv6" : "ipv4");
}
