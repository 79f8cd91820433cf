// Public face of the users feature: other features import only from here (eslint.config.js enforces it).
export { changePassword } from "./users.service";
// Sign-in checks the stored password hash, which no service view carries.
export { findUserByEmail } from "./users.repo";
export { usersFeature } from "./users.router";
