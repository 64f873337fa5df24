// Liveness and readiness for load balancers: 200 when the database answers, 503 otherwise.
import { sequelize } from "../../db/connection";

export async function loader() {
  try {
    await sequelize.query("SELECT 1");
    return Response.json({ status: "ok" });
  } catch {
    return Response.json({ status: "unavailable", message: "database not reachable" }, { status: 503 });
  }
}
