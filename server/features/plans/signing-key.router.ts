import { route, type ApiFeature } from "../../http/route";
import { signingKeyResponseSchema } from "../../../shared/schemas/plans";
import { signingKey } from "./signing";

/**
 * GET /api/signing-key: the public key that checks decision signatures, with its key id. Public on purpose (no session
 * or token) so a pipeline can fetch and pin it once, then verify exports offline.
 */
export const signingKeyFeature: ApiFeature = {
  prefix: "/signing-key",
  tag: "export",
  routes: [
    route({
      method: "get",
      path: "/",
      summary: "Public Ed25519 key (PEM) and key id that check decision signatures (no sign-in)",
      access: "public",
      responses: { 200: signingKeyResponseSchema },
      handler: ({ deps }) => {
        const key = signingKey(deps.config.signingKeyFile);
        return {
          status: 200,
          body: { algorithm: "Ed25519" as const, keyId: key.keyId, publicKeyPem: key.publicKeyPem },
        };
      },
    }),
  ],
};
