// The web server's one change to a request before Next sees it. Next's own server (base-server.js in 16.x)
// writes the socket's peer into X-Forwarded-For only when the request has none (`??=`): a client that sends
// its own header hides its real address. Appending the peer, as every proxy does (MDN, "X-Forwarded-For"),
// keeps the list complete, and lib/auth/client-address.ts counts trusted hops from its right end.

/** X-Forwarded-For after this server's hop: what came in (if anything), then the socket's peer address. */
export function forwardedForWithPeer(incoming, peerAddress) {
  const before = (Array.isArray(incoming) ? incoming.join(', ') : incoming ?? '').trim();
  const peer = peerAddress ?? 'unknown';
  return before ? `${before}, ${peer}` : peer;
}

/** Rewrites a Node request's X-Forwarded-For in place (node:http lower-cases header names). */
export function appendPeerAddress(request) {
  request.headers['x-forwarded-for'] = forwardedForWithPeer(request.headers['x-forwarded-for'], request.socket?.remoteAddress);
}
