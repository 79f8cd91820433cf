// Public face of the tokens feature: other features import only from here (eslint.config.js enforces it).
export { revokeAllTokensOfUser } from "./tokens.service";
export { tokensFeature } from "./tokens.router";
