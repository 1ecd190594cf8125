import type { Metadata } from "next";
import localFont from "next/font/local";
import Script from "next/script";
import "./globals.css";
import { HIGH_CONTRAST_BOOT } from "@/lib/a11y/palette";

const inter = localFont({
  src: "../node_modules/@fontsource-variable/inter/files/inter-latin-wght-normal.woff2",
  variable: "--font-inter",
  weight: "100 900",
  display: "swap",
});

export const metadata: Metadata = {
  title: { default: "Plotproof", template: "%s · Plotproof" },
  description: "Check how accurately planting machines recorded where each plant went.",
  icons: { icon: "/mark.svg" },
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    // The high-contrast class may be added before React hydrates (HIGH_CONTRAST_BOOT), hence the warning switched off.
    <html lang="en" className={inter.variable} suppressHydrationWarning>
      <head>
        <Script id="high-contrast-boot" strategy="beforeInteractive">
          {HIGH_CONTRAST_BOOT}
        </Script>
      </head>
      <body className="min-h-screen bg-chalk font-sans text-ink antialiased">{children}</body>
    </html>
  );
}
