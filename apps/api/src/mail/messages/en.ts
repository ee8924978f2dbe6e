// English e-mail messages; `{placeholder}` is vue-i18n named interpolation, filled by render.ts.

/** The words of one e-mail. `paragraphs` come before the call-to-action button, `afterAction` after it. */
export interface TemplateMessages {
  subject: string;
  heading: string;
  greeting: string;
  paragraphs: readonly string[];
  /** Button label; present exactly for the templates that carry a link (see render.ts). */
  action?: string;
  afterAction?: readonly string[];
}

export interface MailMessages {
  common: {
    /** Shown under the button, followed by the link written out. */
    linkHint: string;
    signOff: string;
    signature: string;
    footer: string;
  };
  /** Membership roles as they read inside a sentence ("… as {role}"). */
  roles: Record<string, string>;
  templates: {
    'verify-email': TemplateMessages;
    'reset-password': TemplateMessages;
    invitation: TemplateMessages;
    'account-locked': TemplateMessages;
    'password-changed': TemplateMessages;
  };
}

const en: MailMessages = {
  common: {
    linkHint: 'If the button does not work, copy this address into your browser:',
    signOff: 'Best wishes,',
    signature: 'Emberline',
    footer: 'This is an automatic message from Emberline. Replies to this address are not read.',
  },
  roles: {
    partner_admin: 'partner admin',
    technician: 'technician',
  },
  templates: {
    'verify-email': {
      subject: 'Confirm your e-mail address for Emberline',
      heading: 'Confirm your e-mail address',
      greeting: 'Hello {name},',
      paragraphs: [
        'Thanks for signing up. Please confirm that this is your e-mail address, so we can send you booking confirmations and job reports.',
      ],
      action: 'Confirm my e-mail address',
      afterAction: ['If you did not create an Emberline account, you can ignore this e-mail.'],
    },
    'reset-password': {
      subject: 'Reset your Emberline password',
      heading: 'Reset your password',
      greeting: 'Hello {name},',
      paragraphs: [
        'We received a request to reset the password of your Emberline account. Use the button below to choose a new one. The link works once, for {minutes}.',
      ],
      action: 'Choose a new password',
      afterAction: ['If you did not ask for this, you can ignore this e-mail: your password stays as it is.'],
    },
    invitation: {
      subject: '{inviterName} invites you to join {organisationName} on Emberline',
      heading: 'You are invited to join {organisationName}',
      greeting: 'Hello,',
      paragraphs: [
        '{inviterName} has invited you to join {organisationName} on Emberline as {role}.',
        'Accept the invitation to set up your account. The invitation is valid for {days}.',
      ],
      action: 'Accept the invitation',
      afterAction: ['If you were not expecting this invitation, you can ignore this e-mail.'],
    },
    'account-locked': {
      subject: 'Your Emberline account is locked for a while',
      heading: 'Your account is locked for a while',
      greeting: 'Hello {name},',
      paragraphs: [
        'There were several failed attempts to sign in to your account, so we have locked it for {minutes} to keep it safe. You can sign in again after that.',
        'If this was not you, someone may be trying to guess your password. To be safe, choose a new password now.',
      ],
      action: 'Choose a new password',
    },
    'password-changed': {
      subject: 'Your Emberline password was changed',
      heading: 'Your password was changed',
      greeting: 'Hello {name},',
      paragraphs: [
        'The password of your Emberline account has just been changed.',
        'If you did this, there is nothing more to do.',
        'If you did not, please choose a new password straight away with "Forgot password?" on the sign-in page.',
      ],
    },
  },
};

export default en;
