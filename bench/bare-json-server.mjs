// Baseline for the API-overhead figure of `npm run bench`: a bare Express app answering one POST route with a fixed
// JSON body (the analysis answer the real app gives), no session, database or engine. Usage: node … <port> <body file>
import fs from "node:fs";
import express from "express";

const [port, bodyFile] = process.argv.slice(2);
const body = JSON.parse(fs.readFileSync(bodyFile, "utf8"));
const app = express();
app.use(express.json({ limit: "512kb" }));
app.post("/api/analyses", (_req, res) => res.json(body));
app.listen(Number(port), "127.0.0.1", () => console.log("ready"));
