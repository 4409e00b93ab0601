#!/usr/bin/env node
// A local SMTP catcher for one machine and for tests: accepts every message on loopback
// (no authentication, no TLS, a size limit) and keeps it instead of delivering it.
// Each message is <dir>/<id>.eml; <dir>/index.jsonl has one line per message:
// {"id","receivedAt","from","to","subject","size"}. The admin page reads both.
// Usage: node scripts/smtp-catcher.mjs --dir .data/mail [--port 2525] [--host 127.0.0.1]
//          [--max-bytes 10485760] [--exit-with-stdin] [--quiet]
// Prints "smtp-catcher: listening on <host>:<port>" once it accepts connections.
import { randomBytes } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { parseArgs } from "node:util";
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";

const { values: args } = parseArgs({
  options: {
    dir: { type: "string" },
    port: { type: "string", default: "0" },
    host: { type: "string", default: "127.0.0.1" },
    "max-bytes": { type: "string", default: String(10 * 1024 * 1024) },
    // Stop when the parent closes our stdin, so a killed launcher leaves no catcher behind.
    "exit-with-stdin": { type: "boolean", default: false },
    // Print only the start line, not one line per caught message.
    quiet: { type: "boolean", default: false },
  },
});

function say(msg) {
  process.stdout.write(`smtp-catcher: ${msg}\n`);
}

if (!args.dir) {
  process.stderr.write("smtp-catcher: --dir is required\n");
  process.exit(2);
}
const dir = path.resolve(args.dir);
const maxBytes = Number(args["max-bytes"]);
const port = Number(args.port);
if (!Number.isInteger(port) || port < 0 || port > 65535 || !Number.isInteger(maxBytes) || maxBytes < 1) {
  process.stderr.write("smtp-catcher: --port must be 0–65535 and --max-bytes a positive integer\n");
  process.exit(2);
}
fs.mkdirSync(dir, { recursive: true });
const indexFile = path.join(dir, "index.jsonl");

// Sortable by time, unique enough for one machine, safe as a file name.
function newId(now) {
  return `${now.toISOString().replace(/[-:.]/g, "")}-${randomBytes(4).toString("hex")}`;
}

async function store(raw, envelope) {
  const now = new Date();
  const id = newId(now);
  let subject = "";
  let headerFrom = "";
  try {
    const parsed = await simpleParser(raw, { skipHtmlToText: true, skipTextToHtml: true, skipTextLinks: true, skipImageLinks: true });
    subject = parsed.subject ?? "";
    headerFrom = parsed.from?.text ?? "";
  } catch {
    // Keep the raw message even if its headers do not parse.
  }
  const file = path.join(dir, `${id}.eml`);
  const tmp = `${file}.tmp`;
  await fs.promises.writeFile(tmp, raw);
  await fs.promises.rename(tmp, file);
  const entry = {
    id,
    receivedAt: now.toISOString(),
    from: headerFrom || envelope.mailFrom?.address || "",
    to: envelope.rcptTo.map((r) => r.address),
    subject,
    size: raw.length,
  };
  // The .eml exists before its index line, so a reader never sees a line without its file.
  await fs.promises.appendFile(indexFile, JSON.stringify(entry) + "\n");
  return entry;
}

const server = new SMTPServer({
  name: "sluice-catcher",
  banner: "Sluice mail catcher: messages are kept, not delivered",
  authOptional: true,
  disabledCommands: ["AUTH", "STARTTLS"],
  size: maxBytes,
  logger: false,
  onData(stream, session, callback) {
    const chunks = [];
    stream.on("data", (chunk) => chunks.push(chunk));
    stream.on("error", (err) => callback(err));
    stream.on("end", () => {
      if (stream.sizeExceeded) {
        const err = Object.assign(new Error(`message exceeds the ${maxBytes}-byte limit`), { responseCode: 552 });
        return callback(err);
      }
      store(Buffer.concat(chunks), session.envelope).then(
        (entry) => {
          if (!args.quiet) say(`caught ${entry.id} for ${entry.to.join(", ")}: ${entry.subject}`);
          callback(null, `kept as ${entry.id}`);
        },
        (err) => {
          process.stderr.write(`smtp-catcher: could not store a message: ${err.message}\n`);
          callback(Object.assign(new Error("could not store the message"), { responseCode: 451 }));
        },
      );
    });
  },
});

server.on("error", (err) => {
  process.stderr.write(`smtp-catcher: ${err.message}\n`);
  if (!server.server?.listening) process.exit(1);
});

let stopping = false;
function stop() {
  if (stopping) return;
  stopping = true;
  server.close(() => process.exit(0));
  setTimeout(() => process.exit(0), 3000).unref();
}
for (const sig of ["SIGINT", "SIGTERM"]) process.on(sig, stop);
if (args["exit-with-stdin"]) {
  process.stdin.on("end", stop);
  process.stdin.on("error", stop);
  process.stdin.resume();
}

server.listen(port, args.host, () => {
  const addr = server.server.address();
  say(`listening on ${args.host}:${addr.port}, keeping messages in ${dir}`);
});
