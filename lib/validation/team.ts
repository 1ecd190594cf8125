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
