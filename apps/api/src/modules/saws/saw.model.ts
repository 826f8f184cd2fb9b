import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { HeadFeed, SawKind, SawStoredStatus } from '@kerfline/domain/saws/schema';

/*
 * A saw is down while it has an open stop, and the blade on it is its open run: both are read in the same query
 * as the saw (these fragments are correlated on the outer alias "Saw"), each through a partial unique index (one open stop, one open run per saw), never stored twice.
 */
export const OPEN_STOP_SQL = `(SELECT json_build_object('stopId', st.id, 'category', st.category, 'planned', st.planned,
    'since', st.started_at) FROM stops st WHERE st.saw_id = "Saw".id AND st.ended_at IS NULL)`;
export const BLADE_ON_SQL = `(SELECT json_build_object('runId', r.id, 'bladeSpecId', r.blade_spec_id, 'bladeSpecName', b.name,
    'since', r.installed_at) FROM blade_runs r JOIN blade_specs b ON b.id = r.blade_spec_id
    WHERE r.saw_id = "Saw".id AND r.removed_at IS NULL)`;
/**
 * Who last set the saw's own head-force limits and when: the newest audit entry of the saw whose values name
 * either limit (index `audit_entries_entity`). Read only while the saw has a limit of its own.
 */
export const HEAD_FORCE_SET_SQL = `(CASE WHEN "Saw".min_head_force_n IS NULL AND "Saw".max_head_force_n IS NULL THEN NULL
    ELSE (SELECT json_build_object('byName', u.name, 'at', a.at) FROM audit_entries a LEFT JOIN users u ON u.id = a.actor_id
    WHERE a.entity = 'Saw' AND a.entity_id = "Saw".id::text
      AND (jsonb_exists(a.after, 'minHeadForceN') OR jsonb_exists(a.after, 'maxHeadForceN'))
    ORDER BY a.at DESC LIMIT 1) END)`;
export const HAS_OPEN_STOP_SQL = `EXISTS (SELECT 1 FROM stops st WHERE st.saw_id = "Saw".id AND st.ended_at IS NULL)`;

/** Lengths in millimetres, band speeds in metres per minute. */
export class Saw extends Model<InferAttributes<Saw>, InferCreationAttributes<Saw>> {
  declare id: CreationOptional<string>;
  declare siteId: string;
  declare assetTag: string;
  declare name: string;
  declare kind: SawKind;
  declare headFeed: CreationOptional<HeadFeed>;
  declare make: string | null;
  declare model: string | null;
  declare wheelDiameterMm: number;
  declare centreDistanceMm: number;
  declare bandWidthMm: number;
  declare bandThicknessMm: number;
  declare bandLengthMm: number;
  declare bandSpeedMinMPerMin: number;
  declare bandSpeedMaxMPerMin: number;
  declare capacityRoundMm: number | null;
  declare capacityRectWidthMm: number | null;
  declare capacityRectHeightMm: number | null;
  /** The saw's own spring-balance limits (N); null: the site's `head_force` setting. */
  declare minHeadForceN: CreationOptional<number | null>;
  declare maxHeadForceN: CreationOptional<number | null>;
  /** Stored: in service or retired. "Down" is derived from an open stop (see saws.service.ts). */
  declare status: CreationOptional<SawStoredStatus>;
  declare retiredAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    const mm = (allowNull = false) => ({ type: DataTypes.DOUBLE, allowNull });
    Saw.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        siteId: { type: DataTypes.UUID, allowNull: false },
        assetTag: { type: DataTypes.TEXT, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        kind: { type: DataTypes.TEXT, allowNull: false },
        headFeed: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'hydraulic' },
        make: { type: DataTypes.TEXT, allowNull: true },
        model: { type: DataTypes.TEXT, allowNull: true },
        wheelDiameterMm: mm(),
        centreDistanceMm: mm(),
        bandWidthMm: mm(),
        bandThicknessMm: mm(),
        bandLengthMm: mm(),
        bandSpeedMinMPerMin: { ...mm(), field: 'band_speed_min_m_per_min' },
        bandSpeedMaxMPerMin: { ...mm(), field: 'band_speed_max_m_per_min' },
        capacityRoundMm: mm(true),
        capacityRectWidthMm: mm(true),
        capacityRectHeightMm: mm(true),
        minHeadForceN: { type: DataTypes.DOUBLE, allowNull: true, field: 'min_head_force_n' },
        maxHeadForceN: { type: DataTypes.DOUBLE, allowNull: true, field: 'max_head_force_n' },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'in_service' },
        retiredAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'Saw', tableName: 'saws' },
    );
  }
}
