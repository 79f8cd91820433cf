import { describe, expect, it } from "vitest";
import { renderToStaticMarkup } from "react-dom/server";
import { Pager } from "@/components/pager";

/** The pager's words and whether each button is open, read from its server-rendered markup. */
function read(props: Parameters<typeof Pager>[0]) {
  const html = renderToStaticMarkup(<Pager {...props} />);
  const button = (label: string) => {
    const m = new RegExp(`<button([^>]*)>${label}</button>`).exec(html);
    if (!m) throw new Error(`no ${label} button in ${html}`);
    return !/\sdisabled=""/.test(m[1]!);
  };
  const words = /<span>([^<]*(?:<!-- -->[^<]*)*)<\/span>/.exec(html)![1]!.replaceAll("<!-- -->", "");
  return { words, previous: button("Previous page"), next: button("Next page") };
}

const onPage = () => {};
/** The audit trail past its counting cap (10 000 events counted, 50 a page), read by cursor. */
const cappedTrail = (page: number, rows: number, hasNext: boolean) =>
  read({ page, pageSize: 50, total: 10_000, totalCapped: true, cursor: { rows, hasNext }, onPage, noun: "Events" });

describe("Pager", () => {
  it("a counted list names its last page and closes Next there", () => {
    expect(read({ page: 3, pageSize: 20, total: 57, onPage, noun: "Plans" })).toEqual({
      words: "Plans 41–57 of 57 · page 3 of 3",
      previous: true,
      next: false,
    });
  });

  it("a capped total keeps Next open while the server names a cursor for the page after", () => {
    const r = cappedTrail(4, 50, true);
    expect(r).toEqual({ words: "Events 151–200 of 10,000+", previous: true, next: true });
  });

  // The defect: past the cap, on the trail's partly filled last page, Next stayed open and asked for a page by number,
  // which the server refuses (page= stops at ceil(10 000 / pageSize)); and the range claimed a full page of rows.
  it("a capped total's partly filled last page closes Next and counts only the rows it holds", () => {
    const r = cappedTrail(205, 13, false);
    expect(r).toEqual({ words: "Events 10,201–10,213 of 10,000+", previous: true, next: false });
  });

  // A position in the list is a row's place, read to the row: past a million, formatCount's short scale ("1 million")
  // named the first and last rows of a deep page the same.
  it("names the rows of a deep page with every digit", () => {
    const r = cappedTrail(20_001, 13, false);
    expect(r.words).toBe("Events 1,000,001–1,000,013 of 10,000+");
  });

  it("a cursor-read list that is counted in full still stops at its last page", () => {
    const r = read({ page: 2, pageSize: 20, total: 40, cursor: { rows: 20, hasNext: true }, onPage, noun: "Plans" });
    expect(r).toEqual({ words: "Plans 21–40 of 40 · page 2 of 2", previous: true, next: false });
  });
});
