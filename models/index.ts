import "server-only";
import { sequelize } from "@/lib/db";
import { AuditEvent } from "./audit-event";
import { Gateway } from "./gateway";
import { SignInThrottle } from "./sign-in-throttle";
import { Site } from "./site";
import { User } from "./user";

const globalForModels = globalThis as unknown as { sluiceModelsReady?: boolean };

if (!globalForModels.sluiceModelsReady || !User.sequelize) {
  User.initModel(sequelize);
  Site.initModel(sequelize);
  Gateway.initModel(sequelize);
  AuditEvent.initModel(sequelize);
  SignInThrottle.initModel(sequelize);

  Site.hasMany(Gateway, { foreignKey: "siteId", as: "gateways" });
  Gateway.belongsTo(Site, { foreignKey: "siteId", as: "site" });
  AuditEvent.belongsTo(User, { foreignKey: "actorId", as: "actor", constraints: false });
  globalForModels.sluiceModelsReady = true;
}

export { sequelize, AuditEvent, Gateway, SignInThrottle, Site, User };
