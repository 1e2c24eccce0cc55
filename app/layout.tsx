import type { Metadata } from "next";
import localFont from "next/font/local";
import "./globals.css";

const ballastSans = localFont({
  src: [
    { path: "./fonts/inter-latin-400-normal.woff2", weight: "400", style: "normal" },
    { path: "./fonts/inter-latin-500-normal.woff2", weight: "500", style: "normal" },
    { path: "./fonts/inter-latin-600-normal.woff2", weight: "600", style: "normal" },
    { path: "./fonts/inter-latin-700-normal.woff2", weight: "700", style: "normal" },
  ],
  variable: "--font-ballast",
  display: "swap",
});

export const metadata: Metadata = {
  title: { default: "Ballast", template: "%s · Ballast" },
  description: "Month-end market risk and capital drafts for small brokers and investment firms.",
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={ballastSans.variable}>
      <body className="min-h-screen font-sans">{children}</body>
    </html>
  );
}
