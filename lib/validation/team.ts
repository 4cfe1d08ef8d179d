import { z } from "zod";
import { emailSchema } from "./auth";
import { cleanText } from "./text";

export const roleSchema = z.enum(["owner", "editor", "viewer"], { error: "Choose owner, editor or viewer." });

export const teamNameSchema = cleanText(
  z.string({ error: "Enter a team name." }).trim().min(1, "Enter a team name.").max(80, "Use at most 80 characters."),
  "Team name",
);

export const teamSchema = z.object({ name: teamNameSchema });
export type TeamInput = z.infer<typeof teamSchema>;

export const memberRoleSchema = z.object({ role: roleSchema });

export const inviteSchema = z.object({ email: emailSchema, role: roleSchema });
export type InviteInput = z.infer<typeof inviteSchema>;

export const acceptInviteSchema = z.object({
  token: z.string({ error: "The invite token is missing." }).trim().min(1, "The invite token is missing.").max(200, "The invite token is not valid."),
});
