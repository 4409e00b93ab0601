import "server-only";
import { sequelize } from "@/lib/db";
import { Assignment, AssignmentTagOverride, CautionAcknowledgement } from "./assignment";
import { AuditEvent } from "./audit-event";
import { Bundle } from "./bundle";
import { Change, ChangeAuthor, type ChangeReview } from "./change";
import { Gateway } from "./gateway";
import { GatewayReport, GatewayToken } from "./gateway-token";
import { ProfileRevision, ReductionProfile } from "./profile";
import { Release } from "./release";
import { SampleSet } from "./sample-set";
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
  ReductionProfile.initModel(sequelize);
  ProfileRevision.initModel(sequelize);
  Assignment.initModel(sequelize);
  AssignmentTagOverride.initModel(sequelize);
  CautionAcknowledgement.initModel(sequelize);
  Release.initModel(sequelize);
  SampleSet.initModel(sequelize);
  Bundle.initModel(sequelize);
  GatewayToken.initModel(sequelize);
  GatewayReport.initModel(sequelize);

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
  ReductionProfile.hasMany(ProfileRevision, { foreignKey: "profileId", as: "revisions" });
  ProfileRevision.belongsTo(ReductionProfile, { foreignKey: "profileId", as: "profile" });
  ProfileRevision.belongsTo(User, { foreignKey: "createdBy", as: "author", constraints: false });
  TagGroup.belongsTo(Site, { foreignKey: "siteId", as: "site" });
  TagGroup.hasOne(Assignment, { foreignKey: "groupId", as: "assignment" });
  Assignment.belongsTo(TagGroup, { foreignKey: "groupId", as: "group" });
  Assignment.belongsTo(ProfileRevision, { foreignKey: "profileRevisionId", as: "revision" });
  Assignment.hasMany(AssignmentTagOverride, { foreignKey: "assignmentId", as: "tagOverrides" });
  AssignmentTagOverride.belongsTo(Tag, { foreignKey: "tagId", as: "tag" });
  Site.hasMany(Release, { foreignKey: "siteId", as: "releases" });
  Release.hasMany(Bundle, { foreignKey: "releaseId", as: "bundles" });
  Release.belongsTo(User, { foreignKey: "releasedBy", as: "releaser", constraints: false });
  SampleSet.belongsTo(User, { foreignKey: "createdBy", as: "author", constraints: false });
  Gateway.hasMany(GatewayToken, { foreignKey: "gatewayId", as: "tokens" });
  GatewayToken.belongsTo(Gateway, { foreignKey: "gatewayId", as: "gateway" });
  Gateway.hasMany(GatewayReport, { foreignKey: "gatewayId", as: "reports" });
  globalForModels.sluiceModelsReady = true;
}

export type { ChangeReview };
export {
  sequelize,
  Assignment,
  AssignmentTagOverride,
  AuditEvent,
  Bundle,
  CautionAcknowledgement,
  Change,
  ChangeAuthor,
  Gateway,
  GatewayReport,
  GatewayToken,
  ProfileRevision,
  ReductionProfile,
  Release,
  SampleSet,
  SignInThrottle,
  Site,
  Tag,
  TagGroup,
  TagGroupRule,
  User,
};
