/**
 * Local SMTP sink for development and tests: accepts any mail on loopback and stores it in
 * mail_sink_messages, where admins read it on the Mail page. Never meant to face a network.
 */
import type { AddressInfo } from "node:net";
import { SMTPServer, type SMTPServerSession } from "smtp-server";
import { simpleParser } from "mailparser";
import type { Db } from "../db/client";
import { mailSinkMessages } from "../db/schema";

export interface MailSink {
  port: number;
  close(): Promise<void>;
}

export interface MailSinkOptions {
  db: Db;
  /** 0 picks a free port. */
  port: number;
  host?: string;
  maxBytes?: number;
}

const DEFAULT_MAX_BYTES = 2 * 1024 * 1024;

/** An SMTP reply code travels on the error; smtp-server answers with it. */
const smtpError = (code: number, message: string) => Object.assign(new Error(message), { responseCode: code });

async function store(db: Db, raw: Buffer, session: SMTPServerSession) {
  const parsed = await simpleParser(raw);
  const envelope = session.envelope;
  await db.insert(mailSinkMessages).values({
    messageId: parsed.messageId ?? null,
    fromAddress: envelope.mailFrom ? envelope.mailFrom.address : "",
    // The envelope names every recipient, including those not shown in the To header.
    toAddresses: envelope.rcptTo.map((a) => a.address),
    subject: parsed.subject ?? "",
    text: parsed.text ?? "",
    raw: raw.toString("utf8"),
  });
}

export async function startMailSink({
  db,
  port,
  host = "127.0.0.1",
  maxBytes = DEFAULT_MAX_BYTES,
}: MailSinkOptions): Promise<MailSink> {
  const server = new SMTPServer({
    banner: "Ropewalk local mail sink",
    authOptional: true,
    disabledCommands: ["AUTH", "STARTTLS"],
    size: maxBytes,
    logger: false,
    closeTimeout: 2000,
    // Loopback only: a reverse DNS lookup per connection would only add delay.
    disableReverseLookup: true,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (c: Buffer) => chunks.push(c));
      stream.on("error", (e) => callback(e));
      stream.on("end", () => {
        if (stream.sizeExceeded)
          return callback(smtpError(552, `message exceeds the sink's limit of ${maxBytes} bytes`));
        store(db, Buffer.concat(chunks), session).then(
          () => callback(),
          (e: unknown) => {
            // A temporary failure: the sender keeps the message and tries again.
            console.error("[mail sink] could not store a message:", (e as Error).message);
            callback(smtpError(451, "the sink could not store the message; try again later"));
          },
        );
      });
    },
  });

  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, host, () => {
      server.off("error", reject);
      resolve();
    });
  });
  server.on("error", (e: Error) => console.error("[mail sink]", e.message));

  return {
    port: (server.server.address() as AddressInfo).port,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
