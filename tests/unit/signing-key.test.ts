import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { payloadBytes, signatureStatus, signingKey, signPayload } from "../../server/features/plans/signing";

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "ropewalk-key-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

describe("the signing key file", () => {
  it("is created at first use as an Ed25519 PKCS#8 PEM with mode 0600, in a folder made on the way", () => {
    const file = path.join(dir, "nested", "signing-key.pem");
    const key = signingKey(file);
    expect(fs.statSync(file).mode & 0o777).toBe(0o600);
    const stored = crypto.createPrivateKey(fs.readFileSync(file, "utf8"));
    expect(stored.asymmetricKeyType).toBe("ed25519");
    expect(key.keyId).toMatch(/^[0-9a-f]{64}$/);
    expect(fs.readdirSync(path.dirname(file))).toEqual(["signing-key.pem"]); // no temporary file left behind
  });

  it("an existing key is used as it is", () => {
    const file = path.join(dir, "given.pem");
    const { privateKey, publicKey } = crypto.generateKeyPairSync("ed25519");
    fs.writeFileSync(file, privateKey.export({ type: "pkcs8", format: "pem" }), { mode: 0o600 });
    const key = signingKey(file);
    expect(key.publicKeyPem).toBe(publicKey.export({ type: "spki", format: "pem" }));
  });

  it("a key file others may read is refused, and so is a key of another type", () => {
    const loose = path.join(dir, "loose.pem");
    fs.writeFileSync(loose, crypto.generateKeyPairSync("ed25519").privateKey.export({ type: "pkcs8", format: "pem" }), {
      mode: 0o644,
    });
    fs.chmodSync(loose, 0o644);
    expect(() => signingKey(loose)).toThrow(/chmod 600/);
    const rsa = path.join(dir, "rsa.pem");
    const rsaKey = crypto.generateKeyPairSync("rsa", { modulusLength: 2048 }).privateKey;
    fs.writeFileSync(rsa, rsaKey.export({ type: "pkcs8", format: "pem" }), { mode: 0o600 });
    expect(() => signingKey(rsa)).toThrow(/Ed25519/);
  });
});

describe("decision signatures", () => {
  const key = signingKey(path.join(dir, "sig.pem"));
  const p = {
    planId: 7,
    revision: 2,
    contentHash: "e7b5".padEnd(64, "0"),
    approverId: 3,
    decision: "approve",
    round: 1,
    time: "2026-01-02T03:04:05.678Z",
  };

  it("sign the RFC 8785 bytes: keys in code-unit order, no whitespace", () => {
    expect(payloadBytes(p).toString()).toBe(
      `{"approverId":3,"contentHash":"${p.contentHash}","decision":"approve","planId":7,"revision":2,"round":1,"time":"2026-01-02T03:04:05.678Z"}`,
    );
  });

  it("verify only for the exact payload and key", () => {
    const sig = signPayload(key, p);
    expect(signatureStatus(key, p, sig, key.keyId)).toBe("valid");
    expect(signatureStatus(key, { ...p, contentHash: "4fe8".padEnd(64, "0") }, sig, key.keyId)).toBe("invalid");
    expect(signatureStatus(key, { ...p, round: 2 }, sig, key.keyId)).toBe("invalid");
    expect(signatureStatus(key, p, "not base64 at all", key.keyId)).toBe("invalid");
    expect(signatureStatus(key, p, null, null)).toBe("missing");
    expect(signatureStatus(key, p, sig, "0".repeat(64))).toBe("unknown_key");
  });
});
