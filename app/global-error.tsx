"use client";

import localFont from "next/font/local";
import "./globals.css";
import { Logo } from "@/app/_components/logo";
import { ErrorNotice } from "@/app/_components/error-notice";

const ballastSans = localFont({
  src: [
    { path: "./fonts/inter-latin-400-normal.woff2", weight: "400", style: "normal" },
    { path: "./fonts/inter-latin-600-normal.woff2", weight: "600", style: "normal" },
  ],
  variable: "--font-ballast",
  display: "swap",
});

/**
 * The last resort: an error in the root layout itself. It replaces the whole document, so it brings its own
 * <html>, <body>, styles and font, and a title (metadata exports are not read here).
 */
export default function GlobalError({ error, retry }: { error: unknown; retry: () => void }) {
  return (
    <html lang="en" className={ballastSans.variable}>
      <body className="min-h-screen bg-paper px-4 py-10 font-sans text-ink">
        <title>Ballast could not start this page</title>
        <div className="mx-auto max-w-xl">
          <Logo />
        </div>
        {/* a plain link: the app's router may be what failed */}
        <ErrorNotice error={error} retry={retry} title="Ballast could not show this page" plainLink>
          <p>Something failed before the page could be laid out. Showing a page reads stored data and changes none of it.</p>
        </ErrorNotice>
      </body>
    </html>
  );
}
