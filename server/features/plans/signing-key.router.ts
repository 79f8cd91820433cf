import { Router } from "express";
import type { AppDeps } from "../../deps";
import { signingKey } from "./signing";

/**
 * GET /api/signing-key: the public key that checks decision signatures, with its key id. Public on purpose (no session
 * or token) so a pipeline can fetch and pin it once, then verify exports offline.
 */
export function signingKeyRouter(deps: AppDeps) {
  const r = Router();
  r.get("/", (_req, res) => {
    const key = signingKey(deps.config.signingKeyFile);
    res.json({ algorithm: "Ed25519", keyId: key.keyId, publicKeyPem: key.publicKeyPem });
  });
  return r;
}
