#!/usr/bin/env node
// Serves the production build of the web app (dist/web, made by `vite build`)
// for `npm start`: on 127.0.0.1 unless HOST says otherwise, on PORT (default
// 5173; 0 takes any free port). Static files only, GET and HEAD, nothing
// outside the build folder. The hashed files under assets/ never change, so
// the browser may keep them; index.html is asked for again every time, so a
// new build shows on the next reload.
import { createReadStream, statSync } from "node:fs";
import { createServer } from "node:http";
import { dirname, extname, join, resolve, sep } from "node:path";
import { fileURLToPath } from "node:url";

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), "..");
/** Where `vite build` writes the app (vite.config.ts `build.outDir`). */
export const APP_DIR = join(ROOT, "dist", "web");

const MEDIA_TYPES = {
  ".html": "text/html; charset=utf-8",
  ".js": "text/javascript; charset=utf-8",
  ".mjs": "text/javascript; charset=utf-8",
  ".css": "text/css; charset=utf-8",
  ".json": "application/json; charset=utf-8",
  ".svg": "image/svg+xml",
  ".png": "image/png",
  ".ico": "image/x-icon",
  ".txt": "text/plain; charset=utf-8",
  ".map": "application/json; charset=utf-8",
  // Browsers compile WebAssembly as it streams in only when it comes as application/wasm.
  ".wasm": "application/wasm",
};

/**
 * The file a request path names inside `dir`, or null when it names nothing
 * there (outside the folder, a folder without index.html, or no such file).
 *
 * @example fileFor("/work/dist/web", "/") // "/work/dist/web/index.html"
 */
export function fileFor(dir, urlPath) {
  let path;
  try {
    path = decodeURIComponent(urlPath.split("?")[0].split("#")[0]);
  } catch {
    return null;
  }
  if (path.includes("\0")) return null;
  const full = resolve(dir, "." + (path.startsWith("/") ? path : `/${path}`));
  if (full !== dir && !full.startsWith(dir + sep)) return null;
  try {
    const s = statSync(full);
    if (s.isFile()) return full;
    if (s.isDirectory()) {
      const index = join(full, "index.html");
      if (statSync(index).isFile()) return index;
    }
  } catch {
    // No such file: a 404 below.
  }
  return null;
}

/**
 * Starts the server. Resolves once it listens, with its address and a way
 * to stop it.
 *
 * @example const s = await serveApp({ port: 0 }); console.log(s.url); await s.close();
 */
export function serveApp({ dir = APP_DIR, host = "127.0.0.1", port = 5173 } = {}) {
  const server = createServer((req, res) => {
    res.setHeader("X-Content-Type-Options", "nosniff");
    if (req.method !== "GET" && req.method !== "HEAD") {
      res.writeHead(405, { Allow: "GET, HEAD", "Content-Type": "text/plain; charset=utf-8" });
      res.end("only GET and HEAD\n");
      return;
    }
    const file = fileFor(dir, req.url ?? "/");
    if (!file) {
      res.writeHead(404, { "Content-Type": "text/plain; charset=utf-8" });
      res.end("not found\n");
      return;
    }
    const size = statSync(file).size;
    const hashed = file.startsWith(join(dir, "assets") + sep);
    res.writeHead(200, {
      "Content-Type": MEDIA_TYPES[extname(file).toLowerCase()] ?? "application/octet-stream",
      "Content-Length": size,
      "Cache-Control": hashed ? "public, max-age=31536000, immutable" : "no-cache",
    });
    if (req.method === "HEAD") {
      res.end();
      return;
    }
    createReadStream(file)
      .on("error", () => res.destroy())
      .pipe(res);
  });
  return new Promise((resolvePromise, reject) => {
    server.once("error", reject);
    server.listen(port, host, () => {
      server.off("error", reject);
      const address = server.address();
      const shownHost = host.includes(":") ? `[${host}]` : host;
      resolvePromise({
        url: `http://${shownHost}:${typeof address === "object" && address ? address.port : port}/`,
        close: () =>
          new Promise((done) => {
            server.close(() => done());
            // A browser keeps its connections open; without this, close would wait for them.
            server.closeAllConnections();
          }),
      });
    });
  });
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const host = process.env.HOST || "127.0.0.1";
  const portText = process.env.PORT || "5173";
  const port = Number(portText);
  if (!/^\d+$/.test(portText) || port > 65535) {
    process.stderr.write(`PORT must be a whole number from 0 to 65535 (got ${JSON.stringify(portText)})\n`);
    process.exit(2);
  }
  if (!fileFor(APP_DIR, "/")) {
    process.stderr.write(`no build in ${APP_DIR}: run \`npm start\` (it builds first) or \`npx vite build\`\n`);
    process.exit(2);
  }
  try {
    const { url, close } = await serveApp({ host, port });
    process.stdout.write(`diodeloom web app: ${url} (the production build in dist/web; Ctrl+C stops it)\n`);
    for (const signal of ["SIGINT", "SIGTERM"]) process.once(signal, () => void close().then(() => process.exit(0)));
  } catch (e) {
    const code = /** @type {NodeJS.ErrnoException} */ (e).code;
    const why = code === "EADDRINUSE" ? `port ${port} is in use; set PORT to another one` : String(/** @type {Error} */ (e).message);
    process.stderr.write(`cannot serve on ${host}:${port}: ${why}\n`);
    process.exit(1);
  }
}
