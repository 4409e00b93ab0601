import "server-only";
import { sequelize } from "@/lib/db";
import { AuditEvent } from "./audit-event";
import { Change, ChangeAuthor } from "./change";
import { Gateway } from "./gateway";
import { SignInThrottle } from "./sign-in-throttle";
import { Site } from "./site";
import { Tag } from "./tag";
import { TagGroup, TagGroupRule } from "./tag-group";
import { User } from "./user";

const globalForModels = globalThis as unknown as { sluiceModelsReady?: boolean };

if (!globalForModels.sluiceModelsReady || !User.sequelize) {
  User.initModel(sequelize);
  Site.initModel(sequelize);
  Gateway.initModel(sequelize);
  AuditEvent.initModel(sequelize);
  SignInThrottle.initModel(sequelize);
  Tag.initModel(sequelize);
  TagGroup.initModel(sequelize);
  TagGroupRule.initModel(sequelize);
  Change.initModel(sequelize);
  ChangeAuthor.initModel(sequelize);

  Site.hasMany(Gateway, { foreignKey: "siteId", as: "gateways" });
  Gateway.belongsTo(Site, { foreignKey: "siteId", as: "site" });
  AuditEvent.belongsTo(User, { foreignKey: "actorId", as: "actor", constraints: false });
  Site.hasMany(Tag, { foreignKey: "siteId", as: "tags" });
  Tag.belongsTo(Gateway, { foreignKey: "gatewayId", as: "gateway" });
  Site.hasMany(TagGroup, { foreignKey: "siteId", as: "groups" });
  TagGroup.hasMany(TagGroupRule, { foreignKey: "groupId", as: "rules" });
  Site.hasMany(Change, { foreignKey: "siteId", as: "changes" });
  Change.hasMany(ChangeAuthor, { foreignKey: "changeId", as: "authors" });
  ChangeAuthor.belongsTo(User, { foreignKey: "userId", as: "user" });
  globalForModels.sluiceModelsReady = true;
}

export { sequelize, AuditEvent, Change, ChangeAuthor, Gateway, SignInThrottle, Site, Tag, TagGroup, TagGroupRule, User };
