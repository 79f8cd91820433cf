import { z } from "zod";
import { route, type ApiFeature } from "../../http/route";
import { deliveryResultSchema, mailViewSchema } from "../../../shared/schemas/mail";
import { deliverNow, listMail } from "./mail.service";

const listQuery = z.object({ q: z.string().trim().max(200).optional() });

/** Admin-only view of the local sink and the outbox; mounted at /api/mail. */
export const mailFeature: ApiFeature = {
  prefix: "/mail",
  tag: "mail",
  routes: [
    route({
      method: "get",
      path: "/",
      summary: "Local mail sink and outbox (admin)",
      access: ["admin"],
      query: listQuery,
      responses: { 200: mailViewSchema },
      handler: async ({ deps, query }) => ({ status: 200, body: await listMail(deps, query.q || undefined) }),
    }),
    route({
      method: "post",
      path: "/deliver",
      summary: "Deliver due mail now (admin)",
      access: ["admin"],
      responses: { 200: deliveryResultSchema },
      handler: async ({ deps }) => ({ status: 200, body: await deliverNow(deps) }),
    }),
  ],
};
