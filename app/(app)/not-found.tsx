import { NotFoundNotice } from "@/app/_components/not-found-notice";

/**
 * A signed-in page that called notFound(): the record does not exist or belongs to another firm (the two are
 * answered alike, so nothing about another firm's records shows). Rendered inside the shell, answered with 404.
 */
export default function NotFound() {
  return (
    <NotFoundNotice title="Nothing to show here" other={{ href: "/periods", label: "All periods" }}>
      <p>This record does not exist for your firm, or the link is out of date. Pick it again from the list it came from.</p>
    </NotFoundNotice>
  );
}
