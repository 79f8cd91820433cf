/** One server-sent event: the `event:` name (default "message") and the joined `data:` lines. */
export type ServerEvent = { event: string; data: string };

/**
 * An incremental parser for a text/event-stream body (the WHATWG format, enough of it for our server):
 * events end at a blank line; `event:` and `data:` fields, comments (":") ignored. Feed it decoded chunks.
 */
export function createEventParser(onEvent: (e: ServerEvent) => void) {
  let buffer = "";
  let event = "message";
  let data: string[] = [];
  const line = (raw: string) => {
    if (raw === "") {
      if (data.length) onEvent({ event, data: data.join("\n") });
      event = "message";
      data = [];
      return;
    }
    if (raw.startsWith(":")) return;
    const colon = raw.indexOf(":");
    const field = colon < 0 ? raw : raw.slice(0, colon);
    const value = colon < 0 ? "" : raw.slice(colon + 1).replace(/^ /, "");
    if (field === "event") event = value;
    else if (field === "data") data.push(value);
  };
  return {
    push(chunk: string) {
      buffer += chunk;
      const lines = buffer.split(/\r\n|\r|\n/);
      buffer = lines.pop() ?? "";
      lines.forEach(line);
    },
    end() {
      if (buffer) line(buffer);
      buffer = "";
      line("");
    },
  };
}

/** Reads a fetch body to the end, handing each event over as it arrives. */
export async function readServerEvents(body: ReadableStream<Uint8Array>, onEvent: (e: ServerEvent) => void) {
  const parser = createEventParser(onEvent);
  const decoder = new TextDecoder();
  const reader = body.getReader();
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    parser.push(decoder.decode(value, { stream: true }));
  }
  parser.push(decoder.decode());
  parser.end();
}
