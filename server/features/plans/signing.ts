import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import canonicalize from "canonicalize";

/**
 * The server's Ed25519 key that signs every decision (docs/signing.md). The private key lives in a file, never in the
 * database, so someone who can rewrite rows still cannot forge a signature over rewritten content.
 */
export interface SigningKey {
  keyId: string;
  publicKeyPem: string;
  privateKey: crypto.KeyObject;
  publicKey: crypto.KeyObject;
}

/** What a decision's signature covers; `time` is the decision's stored timestamp as ISO 8601. */
export interface DecisionPayload {
  planId: number;
  revision: number;
  contentHash: string;
  approverId: number;
  decision: string;
  round: number;
  time: string;
  /** proof decisions only: the evidence the approver read (absent from approval payloads, whose bytes stay as they were) */
  evidenceIds?: number[];
}

/** Key id: SHA-256 (hex) of the public key's DER SubjectPublicKeyInfo, i.e. `openssl pkey -pubin -outform DER | sha256sum`. */
export const keyIdOf = (publicKey: crypto.KeyObject) =>
  crypto
    .createHash("sha256")
    .update(publicKey.export({ type: "spki", format: "der" }))
    .digest("hex");

function fromPem(pem: string, file: string): SigningKey {
  const privateKey = crypto.createPrivateKey(pem);
  if (privateKey.asymmetricKeyType !== "ed25519")
    throw new Error(`${file} holds a ${privateKey.asymmetricKeyType} key; the signing key must be Ed25519`);
  const publicKey = crypto.createPublicKey(privateKey);
  return {
    keyId: keyIdOf(publicKey),
    publicKeyPem: publicKey.export({ type: "spki", format: "pem" }).toString(),
    privateKey,
    publicKey,
  };
}

/**
 * Creates the key file if it is missing. The key is written to a private temporary file and hard-linked into place,
 * so two processes starting at once end up with the same key (the loser of the link reads the winner's).
 */
function createKeyFile(file: string) {
  fs.mkdirSync(path.dirname(file), { recursive: true, mode: 0o700 });
  const { privateKey } = crypto.generateKeyPairSync("ed25519");
  const tmp = `${file}.${process.pid}.${crypto.randomBytes(4).toString("hex")}.tmp`;
  fs.writeFileSync(tmp, privateKey.export({ type: "pkcs8", format: "pem" }), { mode: 0o600, flag: "wx" });
  try {
    fs.linkSync(tmp, file);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code !== "EEXIST") throw e;
  } finally {
    fs.unlinkSync(tmp);
  }
}

const loaded = new Map<string, SigningKey>();

/** The key in `file`, created on first use; refuses a file that others may read. */
export function signingKey(file: string): SigningKey {
  const cached = loaded.get(file);
  if (cached) return cached;
  if (!fs.existsSync(file)) createKeyFile(file);
  const mode = fs.statSync(file).mode & 0o777;
  if (process.platform !== "win32" && mode & 0o077) {
    throw new Error(`signing key ${file} is readable by others (mode ${mode.toString(8)}); run chmod 600 on it`);
  }
  const key = fromPem(fs.readFileSync(file, "utf8"), file);
  loaded.set(file, key);
  return key;
}

/** RFC 8785 canonical JSON of the payload, the exact bytes signed. */
export function payloadBytes(p: DecisionPayload): Buffer {
  const canonical = canonicalize({
    planId: p.planId,
    revision: p.revision,
    contentHash: p.contentHash,
    approverId: p.approverId,
    decision: p.decision,
    round: p.round,
    time: p.time,
    ...(p.evidenceIds ? { evidenceIds: p.evidenceIds } : {}),
  });
  if (canonical === undefined) throw new Error("decision payload cannot be canonicalised");
  return Buffer.from(canonical, "utf8");
}

/** Base64 Ed25519 signature over the payload's canonical bytes. */
export const signPayload = (key: SigningKey, p: DecisionPayload) =>
  crypto.sign(null, payloadBytes(p), key.privateKey).toString("base64");

export type SignatureStatus = "valid" | "invalid" | "missing" | "unknown_key";

/** Checks a stored signature against the current key; a signature by another key cannot be checked here. */
export function signatureStatus(
  key: SigningKey,
  p: DecisionPayload,
  signature: string | null,
  keyId: string | null,
): SignatureStatus {
  if (!signature || !keyId) return "missing";
  if (keyId !== key.keyId) return "unknown_key";
  try {
    return crypto.verify(null, payloadBytes(p), key.publicKey, Buffer.from(signature, "base64")) ? "valid" : "invalid";
  } catch {
    return "invalid";
  }
}
