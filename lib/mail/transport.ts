import "server-only";
import nodemailer, { type Transporter } from "nodemailer";

// Kept on globalThis: instrumentation and route handlers may load separate copies of this module.
const g = globalThis as unknown as { __plateauMail?: { transport: Transporter; url: string; fake: boolean } };

export const MAIL_FROM = process.env.PLATEAU_MAIL_FROM || "Plateau <no-reply@plateau.invalid>";

export function setTransport(url: string, fake: boolean): void {
  g.__plateauMail?.transport.close();
  g.__plateauMail = { transport: nodemailer.createTransport(url), url, fake };
}

export function currentTransport(): { transport: Transporter; url: string; fake: boolean } | undefined {
  return g.__plateauMail;
}
