import { data } from "react-router";

// Every address no other route claims.
export function loader() {
  throw data("Not found", { status: 404 });
}

export default function NotFound() {
  return null;
}
