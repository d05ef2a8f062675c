#!/usr/bin/env python3
"""Serves a built dist/ directory on 127.0.0.1, for trying the app and for the browser tests.

Usage: serve_dist.py DIRECTORY PORT
PORT 0 lets the system pick a free port. The first line printed names the address in use.
"""

import functools
import http.server
import sys


class Handler(http.server.SimpleHTTPRequestHandler):
    # Pinned here rather than read from the system's mime.types, which not every machine has:
    # browsers compile .wasm as it streams only when it arrives as application/wasm.
    extensions_map = {
        **http.server.SimpleHTTPRequestHandler.extensions_map,
        ".wasm": "application/wasm",
        ".js": "text/javascript",
        ".css": "text/css",
        ".json": "application/json",
        ".html": "text/html",
    }

    def end_headers(self):
        # Revalidate on every load, so the browser runs what the last build put in dist/.
        self.send_header("Cache-Control", "no-cache")
        super().end_headers()


def main() -> None:
    if len(sys.argv) != 3:
        sys.exit(__doc__)
    directory, port = sys.argv[1], int(sys.argv[2])
    handler = functools.partial(Handler, directory=directory)
    with http.server.ThreadingHTTPServer(("127.0.0.1", port), handler) as server:
        print(f"serving {directory} at http://127.0.0.1:{server.server_address[1]}/", flush=True)
        try:
            server.serve_forever()
        except KeyboardInterrupt:
            pass


if __name__ == "__main__":
    main()
