import { Sequelize, type Options } from 'sequelize';
import { Activity } from './models/activity.ts';
import { Channel } from './models/channel.ts';
import { Episode, EpisodeGear } from './models/episode.ts';
import { Gear } from './models/gear.ts';
import { Invitation } from './models/invitation.ts';
import { Membership } from './models/membership.ts';
import { LightingCircuit, LightingFixture, SpecSheetLine, Test, TestStep } from './models/test.ts';
import { User } from './models/user.ts';
import { Description, DescriptionVersion } from './models/description.ts';
import { PublishSlot } from './models/publish-slot.ts';
import { Footage, UploadRecord } from './models/footage.ts';
import { Readout } from './models/readout.ts';

export { Activity, Channel, Episode, EpisodeGear, Gear, Invitation, Membership, User };
export { LightingCircuit, LightingFixture, SpecSheetLine, Test, TestStep, type ReadoutRegion } from './models/test.ts';
export { Description, DescriptionVersion, PublishSlot };
export { Footage, UploadRecord, type FootageKind, type FootageStatus } from './models/footage.ts';
export { Readout, type ReadoutKindValue, type ReadoutStatus } from './models/readout.ts';
export type { StoredChapter, StoredGearLink } from './models/description.ts';
export { createMigrator, migrateUp, type MigrationFn } from './migrator.ts';
export { lockUntilCommit } from './locks.ts';

/** Registers every model and association on `sequelize` (idempotent per instance). */
export function initModels(sequelize: Sequelize) {
  for (const m of [User, Channel, Membership, Invitation, Gear, Episode, EpisodeGear, Activity]) m.initModel(sequelize);
  Membership.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  Membership.belongsTo(Channel, { foreignKey: 'channelId', as: 'channel' });
  Channel.hasMany(Membership, { foreignKey: 'channelId', as: 'memberships' });
  User.hasMany(Membership, { foreignKey: 'userId', as: 'memberships' });
  Episode.belongsToMany(Gear, { through: EpisodeGear, foreignKey: 'episodeId', otherKey: 'gearId', as: 'gear' });
  Gear.belongsToMany(Episode, { through: EpisodeGear, foreignKey: 'gearId', otherKey: 'episodeId', as: 'episodes' });
  Episode.belongsTo(User, { foreignKey: 'hostId', as: 'host' });
  Episode.belongsTo(User, { foreignKey: 'editorId', as: 'editor' });
  Activity.belongsTo(User, { foreignKey: 'actorId', as: 'actor' });
  for (const m of [Test, TestStep, SpecSheetLine, LightingCircuit, LightingFixture]) m.initModel(sequelize);
  Test.belongsTo(Episode, { foreignKey: 'episodeId', as: 'episode' });
  Episode.hasMany(Test, { foreignKey: 'episodeId', as: 'tests' });
  Test.hasMany(TestStep, { foreignKey: 'testId', as: 'steps' });
  TestStep.belongsTo(Test, { foreignKey: 'testId', as: 'test' });
  TestStep.belongsTo(User, { foreignKey: 'shotById', as: 'shotBy' });
  Test.hasMany(SpecSheetLine, { foreignKey: 'testId', as: 'specLines' });
  SpecSheetLine.belongsTo(Test, { foreignKey: 'testId', as: 'test' });
  Test.hasMany(LightingCircuit, { foreignKey: 'testId', as: 'circuits' });
  Test.hasMany(LightingFixture, { foreignKey: 'testId', as: 'fixtures' });
  LightingFixture.belongsTo(LightingCircuit, { foreignKey: 'circuitId', as: 'circuit' });
  for (const m of [Description, DescriptionVersion, PublishSlot]) m.initModel(sequelize);
  for (const m of [Footage, UploadRecord]) m.initModel(sequelize);
  Footage.belongsTo(User, { foreignKey: 'uploaderId', as: 'uploader' });
  Footage.belongsTo(User, { foreignKey: 'heldById', as: 'holder' });
  Readout.initModel(sequelize);
  Readout.belongsTo(User, { foreignKey: 'requestedBy', as: 'requester' });
}

/** Returns a Sequelize instance for `url` with every model registered. Times are UTC instants. */
export function createDatabase(url: string, options: Options = {}) {
  const sequelize = new Sequelize(url, {
    dialect: 'postgres',
    logging: false,
    timezone: '+00:00',
    pool: { max: 10, min: 0, idle: 10_000 },
    ...options,
  });
  initModels(sequelize);
  return sequelize;
}
