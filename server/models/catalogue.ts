import { accessionKey, accessionSortKey } from '../../shared/accession.ts';
import type { PhotoColourFacts } from '../../shared/schemas/photo.ts';
import { INGEST_STAGES, type IngestStage } from '../../shared/schemas/ingest.ts';
import type { Spectrum as StoredSpectrum } from '../../shared/colour/spectral.ts';
import { PALETTE_VARIANTS, type PaletteVariant, type PhotoChart } from '../../shared/schemas/chart.ts';
import type { Maker, Mark } from '../../shared/schemas/curatorial.ts';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export type Evidence = 'attributed' | 'identified';
/** An identified term carries the analysis behind it (older rows may lack it). */
export type EvidencedTerm = { name: string; evidence: Evidence; analysisId?: number | null };
export type PieceStatus = 'draft' | 'published';

export class Piece extends Model<InferAttributes<Piece>, InferCreationAttributes<Piece>> {
  declare id: CreationOptional<number>;
  declare accessionNumber: string;
  /** Derived from accessionNumber by its setter: the unique key (no case, no spaces) and the natural sort key. */
  declare accessionKey: CreationOptional<string>;
  declare accessionSort: CreationOptional<string>;
  declare objectName: string;
  declare title: string;
  declare dateText: string | null;
  declare dateEdtf: string | null;
  declare earliestYear: number | null;
  declare latestYear: number | null;
  declare place: string | null;
  declare fibres: string[];
  declare weave: string | null;
  declare threadCount: string | null;
  declare heightMm: number | null;
  declare widthMm: number | null;
  declare repeatMm: number | null;
  declare techniques: string[];
  declare dyestuffs: EvidencedTerm[];
  declare historicalMordants: EvidencedTerm[];
  declare description: string | null;
  declare provenance: string | null;
  declare condition: string | null;
  declare creditLine: string | null;
  declare status: CreationOptional<PieceStatus>;
  // Curatorial fields (migration 0032); storageLocation is for staff only (server/presenters/piece.ts).
  declare makers: CreationOptional<Maker[]>;
  declare patternName: CreationOptional<string | null>;
  declare marks: CreationOptional<Mark[]>;
  declare storageLocation: CreationOptional<string | null>;
  declare objectRights: CreationOptional<string | null>;
  declare imageRights: CreationOptional<string | null>;
  declare createdById: number | null;
  declare deletedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export type PhotoView = 'recto' | 'verso' | 'detail' | 'raking' | 'transmitted' | 'uv' | 'swatch';

export class Photo extends Model<InferAttributes<Photo>, InferCreationAttributes<Photo>> {
  declare id: CreationOptional<number>;
  declare pieceId: number | null;
  declare trialId: number | null;
  declare sha256: string;
  declare format: string;
  declare bytes: number;
  declare width: number;
  declare height: number;
  declare view: CreationOptional<PhotoView>;
  declare originalName: string | null;
  declare caption: string | null;
  declare capturedAt: string | null;
  declare exif: Record<string, unknown>;
  declare gps: { latitude: number; longitude: number; altitude?: number } | null;
  declare derivatives: Record<string, { path: string; width: number; height: number }>;
  declare referencePatch: { x: number; y: number; w: number; h: number } | null;
  declare correction: Record<string, unknown> | null;
  /** The colour chart marked in the photo and its fitted correction (migration 0027), or null. */
  declare chart: CreationOptional<PhotoChart | null>;
  /** How the colours were read (profile, bit depth, colour space); null for photos uploaded before it was recorded. */
  declare colour: CreationOptional<PhotoColourFacts | null>;
  /** How far its processing has come (shared/schemas/ingest.ts, migration 0034); the reason when it failed. */
  declare ingestStage: CreationOptional<IngestStage>;
  declare ingestError: CreationOptional<string | null>;
  declare createdById: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export type RegionPurpose = 'colour-area' | 'motif' | 'exclusion' | 'reference-patch' | 'sampling-site';

export class Region extends Model<InferAttributes<Region>, InferCreationAttributes<Region>> {
  declare id: CreationOptional<number>;
  declare photoId: number;
  declare x: number;
  declare y: number;
  declare w: number;
  declare h: number;
  declare purpose: RegionPurpose;
  declare label: string | null;
  declare createdById: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class PaletteColour extends Model<InferAttributes<PaletteColour>, InferCreationAttributes<PaletteColour>> {
  declare id: CreationOptional<number>;
  declare photoId: number;
  declare regionId: number | null;
  declare variant: PaletteVariant;
  declare rank: number;
  declare L: number;
  declare a: number;
  declare b: number;
  declare hex: string;
  declare share: number;
  declare spread: number;
  declare name: string;
  declare tradeName: string | null;
  declare background: boolean;
  /** The background flag was set by hand: a recompute of this palette keeps it. */
  declare backgroundManual: CreationOptional<boolean>;
  declare source: CreationOptional<string>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class ColourMeasurement extends Model<
  InferAttributes<ColourMeasurement>,
  InferCreationAttributes<ColourMeasurement>
> {
  declare id: CreationOptional<number>;
  declare pieceId: number | null;
  declare regionId: number | null;
  declare trialId: number | null;
  declare instrument: string | null;
  declare geometry: string | null;
  declare specular: 'SCI' | 'SCE' | null;
  declare illuminant: CreationOptional<string>;
  declare observer: CreationOptional<string>;
  declare L: number;
  declare a: number;
  declare b: number;
  declare label: string | null;
  declare source: CreationOptional<string>;
  declare takenOn: string | null;
  /** The reflectance spectrum, values as fractions 0–1 (migration 0026); L, a, b are then computed from it. */
  declare spectrum: CreationOptional<StoredSpectrum | null>;
  declare createdById: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

const pk = () => ({ type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true });
const fk = () => ({ type: DataTypes.INTEGER.UNSIGNED, allowNull: true });
const json = (defaultValue: unknown) => ({ type: DataTypes.JSON, allowNull: false, defaultValue });
const num = () => ({ type: DataTypes.DOUBLE, allowNull: false });
// decimalAsNumber (server/db/sequelize.ts) makes DECIMAL columns arrive as numbers.
const decimal = () => ({ type: DataTypes.DECIMAL(8, 1), allowNull: true });
const stamps = () => ({ createdAt: DataTypes.DATE(3), updatedAt: DataTypes.DATE(3) });

export function initCatalogueModels(sequelize: Sequelize) {
  Piece.init(
    {
      id: pk(),
      accessionNumber: {
        type: DataTypes.STRING(40),
        allowNull: false,
        unique: true,
        // Every write of the number (create, bulkCreate, update) keeps the derived keys in step.
        set(this: Piece, value: string) {
          this.setDataValue('accessionNumber', value);
          this.setDataValue('accessionKey', accessionKey(value));
          this.setDataValue('accessionSort', accessionSortKey(value));
        },
      },
      accessionKey: { type: DataTypes.STRING(40), allowNull: false, unique: true },
      accessionSort: { type: DataTypes.STRING(120, true), allowNull: false },
      objectName: { type: DataTypes.STRING(120), allowNull: false },
      title: { type: DataTypes.STRING(255), allowNull: false },
      dateText: DataTypes.STRING(120),
      dateEdtf: DataTypes.STRING(60),
      earliestYear: DataTypes.SMALLINT,
      latestYear: DataTypes.SMALLINT,
      place: DataTypes.STRING(160),
      fibres: json([]),
      weave: DataTypes.STRING(80),
      threadCount: DataTypes.STRING(60),
      heightMm: decimal(),
      widthMm: decimal(),
      repeatMm: decimal(),
      techniques: json([]),
      dyestuffs: json([]),
      historicalMordants: json([]),
      description: DataTypes.TEXT,
      provenance: DataTypes.TEXT,
      condition: DataTypes.TEXT,
      creditLine: DataTypes.STRING(255),
      status: { type: DataTypes.ENUM('draft', 'published'), allowNull: false, defaultValue: 'draft' },
      makers: json([]),
      patternName: DataTypes.STRING(160),
      marks: json([]),
      storageLocation: DataTypes.STRING(160),
      objectRights: DataTypes.STRING(255),
      imageRights: DataTypes.STRING(255),
      createdById: fk(),
      deletedAt: DataTypes.DATE(3),
      ...stamps(),
    },
    { sequelize, tableName: 'pieces', paranoid: true },
  );
  Photo.init(
    {
      id: pk(),
      pieceId: fk(),
      trialId: fk(),
      sha256: { type: DataTypes.CHAR(64), allowNull: false },
      format: { type: DataTypes.STRING(16), allowNull: false },
      bytes: { type: DataTypes.BIGINT, allowNull: false },
      width: { type: DataTypes.INTEGER, allowNull: false },
      height: { type: DataTypes.INTEGER, allowNull: false },
      view: {
        type: DataTypes.ENUM('recto', 'verso', 'detail', 'raking', 'transmitted', 'uv', 'swatch'),
        allowNull: false,
        defaultValue: 'recto',
      },
      originalName: DataTypes.STRING(255),
      caption: DataTypes.STRING(255),
      capturedAt: DataTypes.STRING(32),
      exif: json({}),
      gps: DataTypes.JSON,
      derivatives: json({}),
      referencePatch: DataTypes.JSON,
      correction: DataTypes.JSON,
      chart: DataTypes.JSON,
      colour: DataTypes.JSON,
      ingestStage: { type: DataTypes.ENUM(...INGEST_STAGES), allowNull: false, defaultValue: 'queued' },
      ingestError: DataTypes.STRING(2000),
      createdById: fk(),
      ...stamps(),
    },
    { sequelize, tableName: 'photos' },
  );
  Region.init(
    {
      id: pk(),
      photoId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      x: { type: DataTypes.INTEGER, allowNull: false },
      y: { type: DataTypes.INTEGER, allowNull: false },
      w: { type: DataTypes.INTEGER, allowNull: false },
      h: { type: DataTypes.INTEGER, allowNull: false },
      purpose: {
        type: DataTypes.ENUM('colour-area', 'motif', 'exclusion', 'reference-patch', 'sampling-site'),
        allowNull: false,
      },
      label: DataTypes.STRING(160),
      createdById: fk(),
      ...stamps(),
    },
    { sequelize, tableName: 'regions' },
  );
  PaletteColour.init(
    {
      id: pk(),
      photoId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      regionId: fk(),
      variant: { type: DataTypes.ENUM(...PALETTE_VARIANTS), allowNull: false, defaultValue: 'raw' },
      rank: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false },
      L: num(),
      a: num(),
      b: num(),
      hex: { type: DataTypes.CHAR(7), allowNull: false },
      share: num(),
      spread: num(),
      name: { type: DataTypes.STRING(80), allowNull: false },
      tradeName: DataTypes.STRING(80),
      background: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      backgroundManual: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      source: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'image-estimate' },
      ...stamps(),
    },
    { sequelize, tableName: 'palette_colours' },
  );
  ColourMeasurement.init(
    {
      id: pk(),
      pieceId: fk(),
      regionId: fk(),
      trialId: fk(),
      instrument: DataTypes.STRING(120),
      geometry: DataTypes.STRING(40),
      specular: DataTypes.ENUM('SCI', 'SCE'),
      illuminant: { type: DataTypes.STRING(8), allowNull: false, defaultValue: 'D65' },
      observer: { type: DataTypes.STRING(4), allowNull: false, defaultValue: '10' },
      L: num(),
      a: num(),
      b: num(),
      label: DataTypes.STRING(160),
      source: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'instrument' },
      takenOn: DataTypes.DATEONLY,
      spectrum: { type: DataTypes.JSON, allowNull: true },
      createdById: fk(),
      ...stamps(),
    },
    { sequelize, tableName: 'colour_measurements' },
  );
}
