import { StatusBadge } from "./status-badge";

/** An upload's state in words, with an icon. */
export function UploadStatus({ status }: { status: string }) {
  switch (status) {
    case "reading":
      return <StatusBadge tone="neutral">Being read</StatusBadge>;
    case "confirming":
      return <StatusBadge tone="neutral">Being stored</StatusBadge>;
    case "failed":
      return <StatusBadge tone="alert">Could not be read</StatusBadge>;
    case "duplicate":
      return <StatusBadge tone="neutral">Uploaded before</StatusBadge>;
    case "pending":
      return <StatusBadge tone="caution">Waiting for confirmation</StatusBadge>;
    case "confirmed":
      return <StatusBadge tone="ok">Confirmed</StatusBadge>;
    case "superseded":
      return <StatusBadge tone="neutral">Superseded</StatusBadge>;
    case "cancelled":
      return <StatusBadge tone="neutral">Cancelled</StatusBadge>;
    default:
      return <StatusBadge tone="neutral">{status}</StatusBadge>;
  }
}
