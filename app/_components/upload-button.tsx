"use client";

import { generateUploadButton } from "@uploadthing/react";
import type { UploadRouter } from "@/app/api/uploadthing/core";

/** The upload service's button, typed by Ballast's file router. */
export const UploadButton = generateUploadButton<UploadRouter>();
