import net from "node:net";
import { afterAll } from "vitest";

export type AnswerDroppingProxy = {
  /** The proxy's base URL (http://127.0.0.1:port), forwarding to the target. */
  url: string;
  /** The next response to arrive loses its connection right after its headers. */
  dropNextAnswer: () => void;
  /** How many answers were dropped so far. */
  dropped: () => number;
  close: () => Promise<void>;
};

const HEAD_END = Buffer.from("\r\n\r\n");

/**
 * A TCP proxy on 127.0.0.1 (a port of its own) in front of an HTTP server. Armed with
 * dropNextAnswer, it passes the headers of the next response it sees to the client and then
 * destroys the client's socket: the request reached the server and the server answered, but the
 * client never reads the answer (a connection dropped after the commit). Everything else passes
 * through unchanged. Closed after the file's tests.
 */
export async function startAnswerDroppingProxy(targetUrl: string): Promise<AnswerDroppingProxy> {
  const target = new URL(targetUrl);
  let armed = false;
  let dropped = 0;
  const sockets = new Set<net.Socket>();
  const server = net.createServer((client) => {
    const upstream = net.connect(Number(target.port), target.hostname);
    sockets.add(client).add(upstream);
    let head = Buffer.alloc(0);
    let dropping = false;
    client.on("data", (chunk) => {
      // A request sent while armed: its answer is the one to drop.
      if (armed) {
        armed = false;
        dropping = true;
      }
      upstream.write(chunk);
    });
    upstream.on("data", (chunk: Buffer) => {
      if (!dropping) {
        client.write(chunk);
        return;
      }
      head = Buffer.concat([head, chunk]);
      const end = head.indexOf(HEAD_END);
      if (end < 0) return;
      dropping = false;
      dropped++;
      client.write(head.subarray(0, end + HEAD_END.length), () => client.destroy());
      upstream.destroy();
    });
    const closeBoth = () => {
      client.destroy();
      upstream.destroy();
      sockets.delete(client);
      sockets.delete(upstream);
    };
    client.on("close", closeBoth).on("error", closeBoth);
    upstream.on("close", closeBoth).on("error", closeBoth);
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const { port } = server.address() as net.AddressInfo;
  const close = () =>
    new Promise<void>((resolve) => {
      for (const s of sockets) s.destroy();
      server.close(() => resolve());
    });
  afterAll(close);
  return {
    url: `http://127.0.0.1:${port}`,
    dropNextAnswer: () => {
      armed = true;
    },
    dropped: () => dropped,
    close,
  };
}
