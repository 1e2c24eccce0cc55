/** Display formats shared by pages: dates as "30 Nov 2026", times in UTC. */
import { format, parseISO } from "date-fns";

export function formatDate(date: string): string {
  return format(parseISO(date), "d MMM yyyy");
}

export function formatMonth(date: string): string {
  return format(parseISO(date), "MMMM yyyy");
}

export function formatTimestamp(iso: string): string {
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}
