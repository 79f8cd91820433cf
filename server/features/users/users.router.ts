import { Router } from "express";
import type { AppDeps } from "../../deps";
import { currentUser, requireRole } from "../../http/auth";
import { parseBody, parseParams } from "../../http/validate";
import { createUserRequestSchema, idParamSchema, updateUserRequestSchema } from "../../../shared/schemas";
import { createUser, listUsers, updateUser } from "./users.service";

export function usersRouter(deps: AppDeps) {
  const r = Router();
  r.use(requireRole("admin"));

  r.get("/", async (_req, res) => {
    res.json({ users: await listUsers(deps) });
  });

  r.post("/", async (req, res) => {
    const input = parseBody(createUserRequestSchema, req);
    res.status(201).json({ user: await createUser(deps, currentUser(res), input) });
  });

  r.patch("/:id", async (req, res) => {
    const { id } = parseParams(idParamSchema, req);
    const input = parseBody(updateUserRequestSchema, req);
    res.json({ user: await updateUser(deps, currentUser(res), id, input) });
  });

  return r;
}
