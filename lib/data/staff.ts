// Data access for clinic staff accounts.
import "server-only";
import { Op } from "sequelize";
import { User } from "@/db/models";

export async function listStaff({ clinicId }: { clinicId: string }) {
  const rows = await User.findAll({
    where: { clinicId, role: { [Op.in]: ["reception", "dentist", "admin"] } },
    order: [["role", "ASC"], ["name", "ASC"]],
  });
  return rows.map((u) => ({ id: u.id, name: u.name, email: u.email, role: u.role, active: u.active }));
}
