"use client";

/** A failure inside a run's tabs (the run's frame and tabs stay): the same notice as every signed-in page, inside this segment's layout. */
export { default } from "@/app/(app)/error";
