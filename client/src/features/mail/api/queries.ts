import { mailViewQuery } from "./list-mail";

/** The mail feature's query factory. */
export const mailQueries = {
  view: mailViewQuery,
};
