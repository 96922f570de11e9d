/**
 * A worker thread that reads a window of a site's Event log in time order and
 * hands it to the thread that started it, a page at a time, while that thread
 * runs the previous pages through the engine (db/queries/replay-log.ts). Plain
 * JavaScript so it starts the same under tsx, vitest and node.
 *
 * Pages go over as columns: event ids and values as arrays, times as a
 * Float64Array, devices and kinds as indexes into lists that grow as new names
 * appear (a site has a few dozen devices: each name crosses once, and the other
 * side gets one string per device instead of one per event). At most `ahead`
 * pages are in flight; the reader waits for a "more" before reading further, so
 * memory stays flat however long the window.
 */
import { parentPort, workerData } from "node:worker_threads";
import { createClient } from "@libsql/client";

const { url, authToken, siteId, from, to, pageSize, ahead } = workerData;
const client = createClient({ url, authToken });
const deviceIndex = new Map();
const kindIndex = new Map();

let credit = ahead;
let stopping = false;
let wake = null;
parentPort.on("message", (message) => {
  if (message === "more") credit++;
  else if (message === "stop") stopping = true;
  else return;
  if (wake) {
    const resolve = wake;
    wake = null;
    resolve();
  }
});

function indexOf(map, fresh, name) {
  let i = map.get(name);
  if (i === undefined) {
    i = map.size;
    map.set(name, i);
    fresh.push(name);
  }
  return i;
}

// One row per page: SQLite builds the page as one JSON array (values already parsed
// from their stored JSON), and one JSON.parse here reads it — several times cheaper
// than the client turning each row into an object. A stored value that is not valid
// JSON (nothing writes one) comes through as its text rather than failing the page.
const PAGE_SQL = `SELECT json_group_array(json_array(seq, event_id, at, device, kind, CASE WHEN value IS NULL THEN NULL WHEN json_valid(value) THEN json(value) ELSE value END))
  FROM (SELECT seq, event_id, at, device, kind, value FROM events WHERE site_id = ? AND at >= ? AND (at > ? OR seq > ?) AND at < ? ORDER BY at, seq LIMIT ?)`;

async function main() {
  let at = from;
  let seq = -1;
  while (!stopping) {
    const rs = await client.execute({ sql: PAGE_SQL, args: [siteId, at, at, seq, to, pageSize] });
    const rows = JSON.parse(rs.rows[0][0]);
    const n = rows.length;
    if (n === 0) break;
    const ids = new Array(n);
    const times = new Float64Array(n);
    const devices = new Uint32Array(n);
    const kinds = new Uint32Array(n);
    const values = new Array(n);
    const newDevices = [];
    const newKinds = [];
    for (let i = 0; i < n; i++) {
      const r = rows[i];
      ids[i] = r[1];
      times[i] = r[2];
      devices[i] = indexOf(deviceIndex, newDevices, r[3]);
      kinds[i] = indexOf(kindIndex, newKinds, r[4]);
      values[i] = r[5];
    }
    at = times[n - 1];
    seq = rows[n - 1][0];
    while (credit <= 0 && !stopping) await new Promise((resolve) => (wake = resolve));
    if (stopping) return;
    credit--;
    parentPort.postMessage({ kind: "page", ids, times, devices, kinds, values, newDevices, newKinds }, [times.buffer, devices.buffer, kinds.buffer]);
    if (n < pageSize) break;
  }
  if (!stopping) parentPort.postMessage({ kind: "end" });
}

// The thread always ends on its own: the client closed, then the port, so its
// event loop empties and it exits with code 0. Never Worker.terminate() it: a
// termination lands as an exception pending in the thread, and the SQLite
// client's native finalisers abort the whole process when they run with one
// pending (seen in CI). The other side asks with "stop" instead.
main()
  .catch((error) => parentPort.postMessage({ kind: "error", message: error instanceof Error ? error.message : String(error) }))
  .finally(() => {
    client.close();
    parentPort.close();
  });
