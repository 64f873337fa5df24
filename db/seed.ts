// Loads the demo scenario once (skips when the demo manager already exists). `tsx db/seed.ts`
import { hashPassword } from "../app/accounts/password.server";
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_PROJECT } from "./demo";
import { Project, ProjectMember, sequelize, User } from "./models";

try {
  const manager = DEMO_PEOPLE.find((p) => p.role === "manager")!;
  if (await User.findOne({ where: { email: manager.email } })) {
    console.log("demo data: already loaded");
  } else {
    const passwordHash = await hashPassword(DEMO_PASSWORD);
    await sequelize.transaction(async (transaction) => {
      const users = new Map<string, User>();
      for (const p of DEMO_PEOPLE) {
        users.set(
          p.email,
          await User.create(
            {
              email: p.email,
              name: p.name,
              phone: p.phone ?? null,
              profession: p.profession,
              passwordHash,
              registrationNumber: p.registrationNumber ?? null,
              registrationBody: p.registrationBody ?? null,
              registrationState: p.registrationNumber ? "unverified" : null,
              verifiedById: null,
              verifiedAt: null,
            },
            { transaction },
          ),
        );
      }
      const project = await Project.create({ ...DEMO_PROJECT, createdById: users.get(manager.email)!.id }, { transaction });
      for (const p of DEMO_PEOPLE) {
        await ProjectMember.create({ projectId: project.id, userId: users.get(p.email)!.id, role: p.role }, { transaction });
      }
    });
    console.log("demo data: loaded");
  }
} finally {
  await sequelize.close();
}
