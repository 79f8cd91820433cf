/**
 * `npm run create-admin -- --email a@b --name "A B" [--password …]`: the first admin on an empty (production) database.
 * Missing values are asked for at the prompt.
 */
import readline from "node:readline/promises";
import { parseArgs } from "node:util";
import { loadConfig } from "../server/config";
import { createDb } from "../server/db/client";
import { migrateDatabase, migrationUrl } from "../server/db/migrate";
import { createUser } from "../server/features/users/users.service";
import { createUserRequestSchema } from "../shared/schemas";

const { values } = parseArgs({
  options: { email: { type: "string" }, name: { type: "string" }, password: { type: "string" } },
});

async function ask(question: string) {
  const rl = readline.createInterface({ input: process.stdin, output: process.stdout });
  const answer = await rl.question(question);
  rl.close();
  return answer.trim();
}

const config = loadConfig();
const { pool, db } = createDb(config.databaseUrl, 2);
try {
  await migrateDatabase(migrationUrl(config), config.databaseUrl);
  const input = createUserRequestSchema.safeParse({
    email: values.email ?? (await ask("E-mail: ")),
    name: values.name ?? (await ask("Name: ")),
    password: values.password ?? (await ask("Password (at least 10 characters): ")),
    roles: ["admin"],
  });
  if (!input.success) {
    console.error(input.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("\n"));
    process.exitCode = 1;
  } else {
    const user = await createUser({ config, pool, db }, null, input.data);
    console.log(`admin created: ${user.email} (id ${user.id})`);
  }
} catch (e) {
  console.error(`create-admin failed: ${(e as Error).message}`);
  process.exitCode = 1;
} finally {
  await pool.end();
}
