import { createServer, type IncomingMessage, type Server, type ServerResponse } from "node:http";
import send from "send";

/** The address pages listen on for reloads and status (Server-Sent Events). */
export const EVENTS_PATH = "/_cosmoledger/events";

/**
 * A static server for the preview's site folder plus one event stream: `status` (errors and warnings of the last
 * rebuild; sent to each page as it connects) and `reload` (the paths of the pages just rendered). Files are served
 * with `send` (no directory listings, no dot files, paths confined to the folder), uncached.
 */
export class PreviewServer {
  private readonly clients = new Set<ServerResponse>();
  private status: unknown = { errors: [], warnings: [] };
  readonly server: Server;

  constructor(private readonly root: string) {
    this.server = createServer((req, res) => this.handle(req, res));
  }

  /** Listens on host:port (port 0: any free port); resolves to the address to open. */
  listen(host: string, port: number): Promise<string> {
    return new Promise((ok, fail) => {
      this.server.once("error", fail);
      this.server.listen(port, host, () => {
        this.server.off("error", fail);
        const a = this.server.address() as { address: string; port: number };
        ok(`http://${a.address.includes(":") ? `[${a.address}]` : a.address}:${a.port}/`);
      });
    });
  }

  private handle(req: IncomingMessage, res: ServerResponse): void {
    const url = new URL(req.url ?? "/", "http://preview.invalid");
    if (url.pathname === EVENTS_PATH) {
      res.writeHead(200, {
        "content-type": "text/event-stream",
        "cache-control": "no-store",
        connection: "keep-alive",
      });
      res.write(`event: status\ndata: ${JSON.stringify(this.status)}\n\n`);
      this.clients.add(res);
      req.on("close", () => this.clients.delete(res));
      return;
    }
    if (req.method !== "GET" && req.method !== "HEAD") {
      res.writeHead(405, { allow: "GET, HEAD" }).end();
      return;
    }
    send(req, url.pathname, {
      root: this.root,
      index: ["index.html"],
      dotfiles: "deny",
      cacheControl: false,
      etag: false,
    })
      .on("error", (e: { status?: number }) => {
        res.writeHead(e.status ?? 500, { "content-type": "text/plain; charset=utf-8" });
        res.end(e.status === 404 ? "Not found in the preview.\n" : "Cannot serve this file.\n");
      })
      .on("headers", (r: ServerResponse) => r.setHeader("cache-control", "no-store"))
      .pipe(res);
  }

  /** Sends an event to every open page; `status` is also kept for pages that connect later. */
  broadcast(event: "status" | "reload", data: unknown): void {
    if (event === "status") this.status = data;
    const message = `event: ${event}\ndata: ${JSON.stringify(data)}\n\n`;
    for (const c of this.clients) c.write(message);
  }

  close(): Promise<void> {
    for (const c of this.clients) c.end();
    this.clients.clear();
    return new Promise((ok) => {
      this.server.close(() => ok());
      this.server.closeAllConnections();
    });
  }
}
