import { StatusBadge } from "./status-badge";

/** An upload's state in words, with an icon. */
export function UploadStatus({ status }: { status: string }) {
  switch (status) {
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
