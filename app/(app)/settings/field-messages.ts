/** One readable line from zod issues: "Item 2: Between 1 and 60." for list entries, the message otherwise. */
export function fieldMessages(issues: readonly { path: PropertyKey[]; message: string }[], field: string): string {
  return issues
    .filter((i) => i.path[0] === field || issues.length === 1)
    .slice(0, 3)
    .map((i) => (typeof i.path[1] === "number" ? `Item ${i.path[1] + 1}: ${i.message}` : i.message))
    .join(" ");
}
