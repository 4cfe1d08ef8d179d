import "server-only";
import type { Knex } from "knex";
import { SMTPServer } from "smtp-server";
import { insertCapturedMail } from "@/db/queries/mail";

export const OUTBOX_HEADER = "X-Plateau-Outbox";
const MAX_MESSAGE_BYTES = 5 * 1024 * 1024;

/** Header value of `name` in a raw message (first occurrence, unfolded), or null. */
export function headerValue(raw: string, name: string): string | null {
  const end = raw.search(/\r?\n\r?\n/);
  const head = (end === -1 ? raw : raw.slice(0, end)).replace(/\r?\n[ \t]+/g, " ");
  const re = new RegExp(`^${name.replace(/[-]/g, "\\-")}:[ \\t]*(.*)$`, "im");
  return re.exec(head)?.[1]?.trim() ?? null;
}

/** Decode an RFC 2047 encoded-word subject (nodemailer encodes non-ASCII subjects). */
function decodeWords(value: string): string {
  return value.replace(/=\?([^?]+)\?([BbQq])\?([^?]*)\?=\s*/g, (_m, _cs: string, enc: string, text: string) => {
    if (enc.toUpperCase() === "B") return Buffer.from(text, "base64").toString("utf8");
    return Buffer.from(
      text.replace(/_/g, " ").replace(/=([0-9A-Fa-f]{2})/g, (_x, h: string) => String.fromCharCode(parseInt(h, 16))),
      "latin1",
    ).toString("utf8");
  });
}

/**
 * A local SMTP server that accepts every message on loopback and records it in `captured_mail`
 * (never relays anything). The reply is sent only after the row is written, so when nodemailer's
 * sendMail resolves the captured copy is already in the database.
 */
export async function startFakeSmtp(q: Knex): Promise<{ port: number; close: () => Promise<void> }> {
  const server = new SMTPServer({
    secure: false,
    authOptional: true,
    disabledCommands: ["AUTH", "STARTTLS"],
    logger: false,
    size: MAX_MESSAGE_BYTES,
    banner: "Plateau local mail catcher (nothing is relayed)",
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (c: Buffer) => chunks.push(c));
      stream.on("end", () => {
        if (stream.sizeExceeded) return callback(new Error("Message too large"));
        const raw = Buffer.concat(chunks).toString("utf8");
        const outbox = Number(headerValue(raw, OUTBOX_HEADER));
        const subject = headerValue(raw, "Subject");
        const from = session.envelope.mailFrom;
        insertCapturedMail(q, {
          outboxId: Number.isInteger(outbox) && outbox > 0 ? outbox : null,
          envelopeFrom: from ? from.address : null,
          envelopeTo: session.envelope.rcptTo.map((r) => r.address),
          subject: subject === null ? null : decodeWords(subject),
          raw,
        }).then(
          () => callback(),
          (e: unknown) => {
            console.error("[mail] could not record a captured message", e);
            callback(new Error("Could not store the message"));
          },
        );
      });
    },
  });
  server.on("error", (e) => console.error("[mail] fake SMTP server error", e));
  const port = await new Promise<number>((resolve, reject) => {
    server.server.once("error", reject);
    server.listen(0, "127.0.0.1", () => {
      const addr = server.server.address();
      if (addr && typeof addr === "object") resolve(addr.port);
      else reject(new Error("fake SMTP server has no port"));
    });
  });
  // Don't keep a script's event loop alive just for the mail catcher.
  server.server.unref();
  return { port, close: () => new Promise<void>((r) => server.close(() => r())) };
}
