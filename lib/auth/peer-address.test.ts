import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createRequire } from "node:module";
import http from "node:http";
import path from "node:path";
import type { AddressInfo } from "node:net";

// The preload that hands the socket's address to the app: a real server on loopback, a client
// that forges the very headers the preload writes.
const require = createRequire(import.meta.url);
let server: http.Server;
let seen: http.IncomingHttpHeaders | null = null;

beforeAll(async () => {
  require(path.resolve(import.meta.dirname, "../../scripts/peer-address.cjs"));
  server = http.createServer((req, res) => {
    seen = req.headers;
    res.end("ok");
  });
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
});
afterAll(() => new Promise<void>((r) => server.close(() => r())));

describe("scripts/peer-address.cjs", () => {
  it("writes the socket's peer address and scheme over whatever the client sent under those names", async () => {
    const { port } = server.address() as AddressInfo;
    await fetch(`http://127.0.0.1:${port}/`, { headers: { "x-dentate-peer": "203.0.113.9", "x-dentate-peer-proto": "https", "x-forwarded-for": "203.0.113.10" } });
    expect(seen?.["x-dentate-peer"]).toBe("127.0.0.1");
    expect(seen?.["x-dentate-peer-proto"]).toBe("http");
    expect(seen?.["x-forwarded-for"]).toBe("203.0.113.10");
  });
});
