// Preloaded into the app server (`node --require`, see APP_NODE_OPTIONS in scripts/lib/common.sh):
// writes the socket's peer address and scheme into request headers that route handlers can read
// (Next.js does not hand the socket to them), replacing any copy a client sent. lib/auth/
// request-info.ts reads them; see the README's scale-out section.
"use strict";
// eslint-disable-next-line @typescript-eslint/no-require-imports -- a CommonJS preload for `node --require`
const http = require("node:http");

const PEER = "x-dentate-peer";
const PEER_PROTO = "x-dentate-peer-proto";

function stamp(req) {
  const socket = req.socket;
  req.headers[PEER] = (socket && socket.remoteAddress) || "unknown";
  req.headers[PEER_PROTO] = socket && socket.encrypted ? "https" : "http";
  // rawHeaders is what some readers copy from: drop a client's copies there too.
  const raw = req.rawHeaders;
  for (let i = raw.length - 2; i >= 0; i -= 2) {
    const name = raw[i].toLowerCase();
    if (name === PEER || name === PEER_PROTO) raw.splice(i, 2);
  }
  raw.push(PEER, req.headers[PEER], PEER_PROTO, req.headers[PEER_PROTO]);
}

const emit = http.Server.prototype.emit;
http.Server.prototype.emit = function (event, req, ...rest) {
  if (event === "request" && req && req.headers) stamp(req);
  return emit.call(this, event, req, ...rest);
};
