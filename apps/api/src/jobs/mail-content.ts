import { Op } from 'sequelize';
import { subject } from '@casl/ability';
import { MAIL_KIND_INFO } from '@kerfline/domain/mail/schema';
import { ROLE_LABELS } from '@kerfline/domain/users/schema';
import { INVITATION_VALID_DAYS } from '@kerfline/domain/invitations/schema';
import { PASSWORD_RESET_VALID_MINUTES } from '@kerfline/domain/auth/schema';
import { loadSignedIn, type SignedIn } from '../modules/auth/auth.service.js';
import { scopedWhere } from '../authz/sequelize-scope.js';
import { Invitation } from '../modules/invitations/invitation.model.js';
import { PasswordReset } from '../modules/auth/password-reset.model.js';
import type { MailLog } from '../modules/mail/mail-log.model.js';
import { Region } from '../modules/regions/region.model.js';
import { Site } from '../modules/sites/site.model.js';
import { User } from '../modules/users/user.model.js';
import { hashLinkToken, type SecretBox } from '../security/link-tokens.js';
import { appLink, type MailSection, type MailView } from '../mail/templates.js';
import {
  lowStockSections,
  monthlySummarySections,
  weeklyDigestSections,
  type SectionBuilder,
  type SectionContext,
} from './digest-sections.js';
import { formatForMail } from './zoned.js';

export type BuildContext = { publicUrl: string; box: SecretBox };

/** A mail ready to render, or the reason it is not sent (recorded as `skipped`). */
export type Built = { view: MailView } | { skip: string };

/**
 * Builds one queued mail from what the database says NOW (not when it was queued): a withdrawn invitation,
 * a used reset link or a deactivated person is not mailed.
 */
export async function buildMail(row: MailLog, ctx: BuildContext): Promise<Built> {
  switch (row.kind) {
    case 'invitation':
      return buildInvitation(row, ctx);
    case 'password_reset':
      return buildPasswordReset(row, ctx);
    case 'weekly_digest':
      return buildScheduled(row, ctx, weeklyDigestSections);
    case 'monthly_summary':
      return buildScheduled(row, ctx, monthlySummarySections);
    case 'low_stock':
      return buildLowStock(row, ctx);
  }
}

function secretOf(row: MailLog, ctx: BuildContext): string | null {
  const sealed = row.payload.sealedSecret;
  return typeof sealed === 'string' ? ctx.box.open(sealed) : null;
}

async function buildInvitation(row: MailLog, ctx: BuildContext): Promise<Built> {
  const invitation = row.invitationId ? await Invitation.findByPk(row.invitationId) : null;
  if (!invitation) return { skip: 'the invitation no longer exists' };
  const token = secretOf(row, ctx);
  if (!token) return { skip: 'the link could not be read (was the session secret changed?); resend the invitation' };
  if (hashLinkToken(token) !== invitation.tokenHash) return { skip: 'a newer link was sent for this invitation' };
  if (invitation.revokedAt) return { skip: 'the invitation was withdrawn' };
  if (invitation.acceptedAt) return { skip: 'the invitation was already accepted' };
  if (invitation.expiresAt.getTime() <= Date.now()) return { skip: 'the invitation expired before it could be sent' };

  const [inviter, site, region] = await Promise.all([
    User.findByPk(invitation.invitedBy, { attributes: ['name'] }),
    invitation.siteId ? Site.findByPk(invitation.siteId) : null,
    invitation.regionId ? Region.findByPk(invitation.regionId) : null,
  ]);
  const inviterName = inviter?.name ?? 'An administrator';
  const where = site
    ? ` at ${site.name}`
    : region
      ? ` for the ${region.name} region`
      : invitation.role === 'manager'
        ? invitation.allSites
          ? ' for every site'
          : ' for the sites you are given'
        : '';
  const timeZone = site?.timeZone ?? 'UTC';
  const greeting = invitation.name ? `Hello ${invitation.name},` : 'Hello,';
  return {
    view: {
      subject: `${inviterName} invited you to Kerfline`,
      preheader: `Set up your Kerfline account as ${ROLE_LABELS[invitation.role]}${where}.`,
      heading: 'You are invited to Kerfline',
      paragraphs: [
        greeting,
        `${inviterName} invited you to Kerfline as ${ROLE_LABELS[invitation.role]}${where}. Kerfline keeps the record of the plant's band saws, blades, stops and maintenance checks.`,
        `Open the link to choose your name and password. You will sign in with this address: ${invitation.email}.`,
      ],
      action: { label: 'Set up your account', url: appLink(ctx.publicUrl, '/invitation', { token }) },
      notes: [
        `The link works once, until ${formatForMail(invitation.expiresAt, timeZone)} (${INVITATION_VALID_DAYS} days after it was sent).`,
        'If you did not expect this invitation, ignore this mail: no account is made until the link is used.',
      ],
      footer: `You get this mail because ${inviterName} entered your address in Kerfline.`,
    },
  };
}

async function buildPasswordReset(row: MailLog, ctx: BuildContext): Promise<Built> {
  const resetId = row.payload.resetId;
  const reset = typeof resetId === 'string' ? await PasswordReset.findByPk(resetId) : null;
  const user = row.userId ? await User.findByPk(row.userId) : null;
  if (!reset || !user) return { skip: 'the reset request no longer exists' };
  if (!user.active) return { skip: 'the account was deactivated' };
  if (reset.usedAt) return { skip: 'the link was already used or replaced' };
  if (reset.expiresAt.getTime() <= Date.now()) return { skip: 'the link expired before it could be sent' };
  const token = secretOf(row, ctx);
  if (!token || hashLinkToken(token) !== reset.tokenHash) return { skip: 'the link could not be read' };
  const site = user.siteId ? await Site.findByPk(user.siteId, { attributes: ['timeZone'] }) : null;
  return {
    view: {
      subject: 'Choose a new Kerfline password',
      preheader: `A link to choose a new password, valid for ${PASSWORD_RESET_VALID_MINUTES} minutes.`,
      heading: 'Choose a new password',
      paragraphs: [
        `Hello ${user.name},`,
        `Someone (we hope you) asked for a new password for the Kerfline account ${user.email}.`,
      ],
      action: { label: 'Choose a new password', url: appLink(ctx.publicUrl, '/reset-password', { token }) },
      notes: [
        `The link works once, until ${formatForMail(reset.expiresAt, site?.timeZone ?? 'UTC')}. Choosing a new password signs you out on every device.`,
        'If you did not ask for this, ignore this mail: your password stays as it is.',
      ],
      footer: 'You get this mail because a new password was asked for on the Kerfline sign-in page.',
    },
  };
}

/** The recipient as they are now; null when they were deactivated or removed from the role since. */
async function recipient(row: MailLog): Promise<SignedIn | null> {
  return row.userId ? loadSignedIn(row.userId) : null;
}

const optOutFooter = (row: MailLog, ctx: BuildContext) => ({
  footer: `You get the ${MAIL_KIND_INFO[row.kind].label.toLowerCase()} because of your role in Kerfline. You can turn it off on your account page.`,
  footerLink: { label: 'Your account', url: appLink(ctx.publicUrl, '/account') },
});

async function runSections(builders: SectionBuilder[], sectionCtx: SectionContext): Promise<MailSection[]> {
  const sections: MailSection[] = [];
  for (const builder of builders) {
    const section = await builder.build(sectionCtx);
    if (section) sections.push(section);
  }
  return sections;
}

/** The weekly digest and the monthly summary: the recipient's own sites, read with their own ability. */
async function buildScheduled(row: MailLog, ctx: BuildContext, builders: SectionBuilder[]): Promise<Built> {
  const signedIn = await recipient(row);
  if (!signedIn) return { skip: 'the person is no longer active' };
  const expected = MAIL_KIND_INFO[row.kind].roles;
  if (!expected.includes(signedIn.user.role)) return { skip: 'the person no longer has a role that gets this mail' };
  const period = String(row.payload.period ?? '');
  const digest = row.kind === 'weekly_digest';
  const regionId = signedIn.user.regionId;
  const region =
    digest && regionId
      ? await Region.findOne({ where: scopedWhere(signedIn.ability, 'read', 'Region', Region, { id: regionId }) })
      : null;
  if (digest && !region) return { skip: 'the person has no region' };
  const sites = await Site.findAll({
    where: scopedWhere(signedIn.ability, 'read', 'Site', Site, {
      retiredAt: { [Op.is]: null },
      ...(region ? { regionId: region.id } : {}),
    }),
    order: [['name', 'ASC']],
  });
  const sections = await runSections(builders, { signedIn, sites, period, publicUrl: ctx.publicUrl });
  const firstName = signedIn.user.name.split(' ')[0] ?? signedIn.user.name;
  return {
    view: digest
      ? {
          subject: `Kerfline weekly digest: ${region!.name}, week ${period.slice(-2)}`,
          preheader: `${sites.length} sites in ${region!.name}: what changed and what needs a look.`,
          heading: `${region!.name}: week ${period}`,
          paragraphs: [`Good morning ${firstName}, here is where the sites of ${region!.name} stand.`],
          sections,
          ...optOutFooter(row, ctx),
        }
      : {
          subject: `Kerfline monthly summary for ${period}`,
          preheader: `Your ${sites.length} sites at a glance.`,
          heading: `Your sites, ${period}`,
          paragraphs: [`Hello ${firstName}, here are the sites you follow as they stand at the start of the month.`],
          sections,
          ...optOutFooter(row, ctx),
        },
  };
}

async function buildLowStock(row: MailLog, ctx: BuildContext): Promise<Built> {
  const signedIn = await recipient(row);
  if (!signedIn) return { skip: 'the person is no longer active' };
  const siteId = row.payload.siteId;
  const site = typeof siteId === 'string' ? await Site.findByPk(siteId) : null;
  // The notice is about one site: only if the recipient may read it, whatever queued the mail.
  if (!site || !signedIn.ability.can('read', subject('Site', { id: site.id, regionId: site.regionId })))
    return { skip: 'the person cannot see that site' };
  const sections = await runSections(lowStockSections, {
    signedIn,
    sites: [site],
    period: String(row.payload.period ?? ''),
    publicUrl: ctx.publicUrl,
  });
  if (sections.every((s) => s.rows.length === 0)) return { skip: 'nothing is below its reorder point' };
  return {
    view: {
      subject: `Kerfline: blade stock is low at ${site.name}`,
      preheader: 'Some blade specs are below their reorder point.',
      heading: `Low blade stock at ${site.name}`,
      paragraphs: ['These blade specs have fallen below their reorder point.'],
      sections,
      ...optOutFooter(row, ctx),
    },
  };
}
