import type { Sequelize } from 'sequelize';
import type { Role } from '@kerfline/domain/users/schema';
import type { HeadFeed, SawKind, SawStatus } from '@kerfline/domain/saws/schema';
import { settingDefinition } from '@kerfline/domain/settings/registry';
import { psiToPa } from '@kerfline/domain/units/units';
import { hashPassword } from '../security/passwords.js';
import { Region } from '../modules/regions/region.model.js';
import { Site } from '../modules/sites/site.model.js';
import { User, UserSite } from '../modules/users/user.model.js';
import { Saw } from '../modules/saws/saw.model.js';
import { SiteSetting } from '../modules/site-settings/site-setting.model.js';
import { AuditEntry } from '../modules/audit/audit-entry.model.js';
import { loadDemoFleet } from './demo-fleet.js';
import { loadDemoHistory } from './demo-history.js';
import { loadDemoChecks } from './demo-checks.js';
import { seedSiteChecks } from '../modules/site-checks/seed-site-checks.js';

/*
 * The demo scenario: Corvane Metals, an invented bar, tube and structural distributor with five cutting
 * sites in two regions. Every name and figure here is invented for the demo.
 */

export const DEMO_PASSWORD = 'corvane-demo-2026';

export const DEMO_SIGN_INS: {
  role: Role;
  email: string;
  name: string;
  site?: string;
  region?: string;
  allSites?: boolean;
}[] = [
  { role: 'admin', email: 'noor.haddad@corvane.example', name: 'Noor Haddad' },
  { role: 'manager', email: 'grace.okafor@corvane.example', name: 'Grace Okafor', allSites: true },
  { role: 'regional_lead', email: 'tomasz.wren@corvane.example', name: 'Tomasz Wren', region: 'Lakes & Lowlands' },
  { role: 'site_admin', email: 'ines.carvalho@corvane.example', name: 'Ines Carvalho', site: 'CV-HAM' },
  { role: 'technician', email: 'dale.pruitt@corvane.example', name: 'Dale Pruitt', site: 'CV-HAM' },
];

const EXTRA_PEOPLE: typeof DEMO_SIGN_INS = [
  { role: 'technician', email: 'marisol.vega@corvane.example', name: 'Marisol Vega', site: 'CV-MTY' },
  { role: 'technician', email: 'joost.bakker@corvane.example', name: 'Joost Bakker', site: 'CV-RTM' },
  { role: 'site_admin', email: 'leroy.haynes@corvane.example', name: 'Leroy Haynes', site: 'CV-HOU' },
  { role: 'regional_lead', email: 'ana.quiroga@corvane.example', name: 'Ana Quiroga', region: 'Gulf & Sierra' },
];

const REGIONS = ['Lakes & Lowlands', 'Gulf & Sierra'] as const;

const SITES = [
  {
    code: 'CV-HAM',
    name: 'Hammerfield Service Centre',
    city: 'Hamilton, Ontario',
    timeZone: 'America/Toronto',
    currency: 'CAD',
    unitSystem: 'imperial',
    region: 'Lakes & Lowlands',
  },
  {
    code: 'CV-DBN',
    name: 'Riverbend Tube Works',
    city: 'Dearborn, Michigan',
    timeZone: 'America/Detroit',
    currency: 'USD',
    unitSystem: 'imperial',
    region: 'Lakes & Lowlands',
  },
  {
    code: 'CV-RTM',
    name: 'Maasvlakte Bar Depot',
    city: 'Rotterdam',
    timeZone: 'Europe/Amsterdam',
    currency: 'EUR',
    unitSystem: 'metric',
    region: 'Lakes & Lowlands',
  },
  {
    code: 'CV-HOU',
    name: 'Bayou Structural Yard',
    city: 'Houston, Texas',
    timeZone: 'America/Chicago',
    currency: 'USD',
    unitSystem: 'imperial',
    region: 'Gulf & Sierra',
  },
  {
    code: 'CV-MTY',
    name: 'Sierra Cutting Hall',
    city: 'Monterrey',
    timeZone: 'America/Monterrey',
    currency: 'MXN',
    unitSystem: 'metric',
    region: 'Gulf & Sierra',
  },
] as const;

type SawClass = {
  kind: SawKind;
  headFeed: HeadFeed;
  make: string;
  model: string;
  wheelMm: number;
  widthMm: number;
  thicknessMm: number;
  lengthMm: number;
  speed: [number, number];
  roundMm: number;
  rect: [number, number];
};

const IN = 25.4;
const FPM = 0.3048;

/**
 * Saw classes of the demo fleet, in the sizes each kind of site buys: metric bands at metric sites, inch bands
 * (1-1/4 x .042 and so on) at imperial ones. Makers and models are invented words, never model numbers. The small
 * saws' heads feed by gravity against a spring; the rest are hydraulic.
 */
const CLASSES: Record<string, Record<'metric' | 'imperial', SawClass>> = {
  light: {
    metric: {
      kind: 'horizontal',
      make: 'Harrowdale',
      model: 'Kestrel',
      headFeed: 'gravity_spring',
      wheelMm: 380,
      widthMm: 27,
      thicknessMm: 0.9,
      lengthMm: 3505,
      speed: [20, 90],
      roundMm: 260,
      rect: [300, 260],
    },
    imperial: {
      kind: 'horizontal',
      make: 'Harrowdale',
      model: 'Kestrel',
      headFeed: 'gravity_spring',
      wheelMm: 15 * IN,
      widthMm: 1 * IN,
      thicknessMm: 0.035 * IN,
      lengthMm: 138 * IN,
      speed: [65 * FPM, 295 * FPM],
      roundMm: 10 * IN,
      rect: [12 * IN, 10 * IN],
    },
  },
  mid: {
    metric: {
      kind: 'horizontal',
      make: 'Harrowdale',
      model: 'Marlstone',
      headFeed: 'hydraulic',
      wheelMm: 455,
      widthMm: 34,
      thicknessMm: 1.1,
      lengthMm: 4115,
      speed: [18, 110],
      roundMm: 360,
      rect: [460, 360],
    },
    imperial: {
      kind: 'horizontal',
      make: 'Harrowdale',
      model: 'Marlstone',
      headFeed: 'hydraulic',
      wheelMm: 18 * IN,
      widthMm: 1.25 * IN,
      thicknessMm: 0.042 * IN,
      lengthMm: 162 * IN,
      speed: [60 * FPM, 360 * FPM],
      roundMm: 14 * IN,
      rect: [18 * IN, 14 * IN],
    },
  },
  heavy: {
    metric: {
      kind: 'horizontal',
      make: 'Quernwick',
      model: 'Greywether',
      headFeed: 'hydraulic',
      wheelMm: 610,
      widthMm: 41,
      thicknessMm: 1.3,
      lengthMm: 6120,
      speed: [15, 100],
      roundMm: 560,
      rect: [700, 560],
    },
    imperial: {
      kind: 'horizontal',
      make: 'Quernwick',
      model: 'Greywether',
      headFeed: 'hydraulic',
      wheelMm: 24 * IN,
      widthMm: 1.5 * IN,
      thicknessMm: 0.05 * IN,
      lengthMm: 241 * IN,
      speed: [50 * FPM, 330 * FPM],
      roundMm: 22 * IN,
      rect: [28 * IN, 22 * IN],
    },
  },
  beam: {
    metric: {
      kind: 'horizontal',
      make: 'Quernwick',
      model: 'Longreach',
      headFeed: 'hydraulic',
      wheelMm: 700,
      widthMm: 54,
      thicknessMm: 1.6,
      lengthMm: 8800,
      speed: [15, 95],
      roundMm: 700,
      rect: [1100, 600],
    },
    imperial: {
      kind: 'horizontal',
      make: 'Quernwick',
      model: 'Longreach',
      headFeed: 'hydraulic',
      wheelMm: 27.5 * IN,
      widthMm: 2 * IN,
      thicknessMm: 0.063 * IN,
      lengthMm: 346 * IN,
      speed: [50 * FPM, 310 * FPM],
      roundMm: 28 * IN,
      rect: [43 * IN, 24 * IN],
    },
  },
  vertical: {
    metric: {
      kind: 'vertical',
      make: 'Ostlemere',
      model: 'Brindle',
      headFeed: 'hydraulic',
      wheelMm: 460,
      widthMm: 13,
      thicknessMm: 0.65,
      lengthMm: 3960,
      speed: [15, 450],
      roundMm: 300,
      rect: [450, 300],
    },
    imperial: {
      kind: 'vertical',
      make: 'Ostlemere',
      model: 'Brindle',
      headFeed: 'hydraulic',
      wheelMm: 18 * IN,
      widthMm: 0.5 * IN,
      thicknessMm: 0.025 * IN,
      lengthMm: 156 * IN,
      speed: [50 * FPM, 1500 * FPM],
      roundMm: 12 * IN,
      rect: [18 * IN, 12 * IN],
    },
  },
};

const FLEET: Record<string, { cls: keyof typeof CLASSES; status?: SawStatus }[]> = {
  'CV-HAM': [
    { cls: 'mid' },
    { cls: 'mid' },
    { cls: 'mid', status: 'down' },
    { cls: 'heavy' },
    { cls: 'light' },
    { cls: 'vertical' },
    { cls: 'light', status: 'retired' },
  ],
  'CV-DBN': [{ cls: 'light' }, { cls: 'light' }, { cls: 'mid' }, { cls: 'mid' }, { cls: 'heavy' }, { cls: 'vertical' }],
  'CV-RTM': [{ cls: 'mid' }, { cls: 'mid' }, { cls: 'heavy' }, { cls: 'heavy', status: 'down' }, { cls: 'light' }],
  'CV-HOU': [
    { cls: 'beam' },
    { cls: 'beam' },
    { cls: 'heavy' },
    { cls: 'heavy' },
    { cls: 'mid' },
    { cls: 'mid' },
    { cls: 'light' },
  ],
  'CV-MTY': [{ cls: 'mid' }, { cls: 'mid' }, { cls: 'light' }, { cls: 'heavy' }, { cls: 'vertical' }],
};

/**
 * Riverbend keeps its own tension range for carbon bands (a blade maker's figure its admin typed in), so the
 * demo shows a site's own setting, with its history, beside Kerfline's shipped values.
 */
const DEMO_SETTINGS = [
  {
    site: 'CV-DBN',
    key: 'band_tension.carbon',
    by: 'noor.haddad@corvane.example',
    at: new Date('2026-10-14T15:20:00Z'),
    value: { minMPa: psiToPa(17000) / 1e6, maxMPa: psiToPa(22000) / 1e6 },
  },
];

const NICKNAMES = [
  'Bay 1 bar saw',
  'Bay 2 bar saw',
  'Tube line saw',
  'Heavy bar saw',
  'Offcut saw',
  'Contour saw',
  'Beam line saw',
  'Bundle saw',
];

/** Loads the scenario in one transaction when the database holds no regions yet. Returns whether it loaded. */
export async function loadDemoScenario(sequelize: Sequelize): Promise<boolean> {
  if ((await Region.count()) > 0) return false;
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  await sequelize.transaction(async (transaction) => {
    const regionIds = new Map<string, string>();
    for (const name of REGIONS) regionIds.set(name, (await Region.create({ name }, { transaction })).id);

    const siteIds = new Map<string, string>();
    for (const s of SITES) {
      const site = await Site.create(
        {
          code: s.code,
          name: s.name,
          city: s.city,
          timeZone: s.timeZone,
          currency: s.currency,
          unitSystem: s.unitSystem,
          regionId: regionIds.get(s.region)!,
        },
        { transaction },
      );
      siteIds.set(s.code, site.id);
      // Every site starts with the shipped list of checks, as a site made in the app does.
      await seedSiteChecks(site.id, transaction);
    }

    for (const [code, saws] of Object.entries(FLEET)) {
      let n = 0;
      for (const { cls, status } of saws) {
        n += 1;
        const system = SITES.find((s) => s.code === code)!.unitSystem;
        const c = CLASSES[cls]![system];
        // Open-belt length with equal wheels: L = 2C + πD, so C = (L − πD) / 2; rounded to 1 mm or 1/8 in.
        const step = system === 'imperial' ? IN / 8 : 1;
        const centreDistanceMm = Math.round((c.lengthMm - Math.PI * c.wheelMm) / 2 / step) * step;
        await Saw.create(
          {
            siteId: siteIds.get(code)!,
            assetTag: `${code.slice(3)}-S${String(n).padStart(2, '0')}`,
            name:
              cls === 'vertical'
                ? 'Contour saw'
                : cls === 'beam'
                  ? `Beam line saw ${n}`
                  : (NICKNAMES[(n - 1) % 5] ?? `Saw ${n}`),
            kind: c.kind,
            headFeed: c.headFeed,
            make: c.make,
            model: c.model,
            wheelDiameterMm: c.wheelMm,
            centreDistanceMm,
            bandWidthMm: c.widthMm,
            bandThicknessMm: c.thicknessMm,
            bandLengthMm: c.lengthMm,
            bandSpeedMinMPerMin: c.speed[0],
            bandSpeedMaxMPerMin: c.speed[1],
            capacityRoundMm: c.roundMm,
            capacityRectWidthMm: c.rect[0],
            capacityRectHeightMm: c.rect[1],
            status: status === 'retired' ? 'retired' : 'in_service',
            retiredAt: status === 'retired' ? new Date('2025-06-30T12:00:00Z') : null,
          },
          { transaction },
        );
      }
    }

    const userIds = new Map<string, string>();
    for (const p of [...DEMO_SIGN_INS, ...EXTRA_PEOPLE]) {
      const user = await User.create(
        {
          email: p.email,
          name: p.name,
          role: p.role,
          passwordHash,
          siteId: p.site ? siteIds.get(p.site)! : null,
          regionId: p.region ? regionIds.get(p.region)! : null,
          allSites: Boolean(p.allSites),
        },
        { transaction },
      );
      if (p.role === 'manager' && !p.allSites) {
        await UserSite.bulkCreate(
          [...siteIds.values()].map((siteId) => ({ userId: user.id, siteId })),
          { transaction },
        );
      }
      userIds.set(p.email, user.id);
    }

    for (const d of DEMO_SETTINGS) {
      const def = settingDefinition(d.key);
      if (!def) continue;
      const siteId = siteIds.get(d.site)!;
      const changedBy = userIds.get(d.by)!;
      await SiteSetting.create({ siteId, key: d.key, value: d.value, changedBy, changedAt: d.at }, { transaction });
      await AuditEntry.create(
        {
          at: d.at,
          actorId: changedBy,
          siteId,
          entity: 'SiteSetting',
          entityId: d.key,
          action: 'update',
          before: { ...def.defaults, source: 'shipped' },
          after: { ...d.value, source: 'site' },
        },
        { transaction },
      );
    }

    await loadDemoHistory(sequelize, transaction);
    await loadDemoChecks(sequelize, transaction);
    await loadDemoFleet(sequelize, transaction);
  });
  return true;
}
