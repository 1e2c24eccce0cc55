"use client";

/** A failure inside the period's pages: the same notice as every signed-in page, inside this segment's layout. */
export { default } from "@/app/(app)/error";
