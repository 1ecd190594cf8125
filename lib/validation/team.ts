import { z } from "zod";
import { ROLES } from "@/lib/roles";

export const InviteInput = z.object({
  email: z
    .email("Enter a valid e-mail address, e.g. name@farm.example.")
    .max(254)
    .transform((e) => e.toLowerCase()),
  role: z.enum(ROLES, { message: "Choose a role." }),
});

export const RoleInput = z.object({ role: z.enum(ROLES, { message: "Choose a role." }) });

export const InvitationIdParam = z.object({ id: z.string().min(1).max(100) });
export const MemberIdParam = z.object({ memberId: z.string().min(1).max(100) });
