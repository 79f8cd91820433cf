import { z } from "zod";
import { userSchema } from "../../../../../shared/schemas/users";

/** Body of POST /api/users and PATCH /api/users/:id. Not in shared/ yet; move it there when the server exports one. */
export const userResponseSchema = z.object({ user: userSchema });
