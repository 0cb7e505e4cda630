import { data } from "react-router";

/** The desk's 404 for a record that is not there (or an id that is not one). */
export function deskNotFound(what: string): never {
  throw data({ message: `There is no ${what} at this address.` }, { status: 404, statusText: "Not Found" });
}
