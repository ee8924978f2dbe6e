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
    'application-submitted': TemplateMessages;
    'application-approved': TemplateMessages;
    'application-changes-requested': TemplateMessages;
    'application-rejected': TemplateMessages;
    'organisation-suspended': TemplateMessages;
    'organisation-reinstated': TemplateMessages;
    'insurance-expiring': TemplateMessages;
    'partner-suspended': TemplateMessages;
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
    'application-submitted': {
      subject: 'New partner application: {organisationName}',
      heading: '{organisationName} has applied',
      greeting: 'Hello,',
      paragraphs: ['{organisationName} has submitted its application to join the network. It is waiting in the review queue.'],
      action: 'Review the application',
    },
    'application-approved': {
      subject: '{organisationName} is approved on Emberline',
      heading: 'Welcome to the network',
      greeting: 'Hello {name},',
      paragraphs: [
        'Good news: we have checked the application of {organisationName} and approved it.',
        'Van owners can now find you in the Directory. Set up your services, prices and working hours so they can book you.',
      ],
      action: 'Open the Console',
    },
    'application-changes-requested': {
      subject: 'Your Emberline application needs a few changes',
      heading: 'A few changes, please',
      greeting: 'Hello {name},',
      paragraphs: [
        'We have looked at the application of {organisationName} and need a few changes before we can approve it:',
        '{message}',
        'You will find our notes next to the fields concerned. Make the changes and submit the application again.',
      ],
      action: 'Edit the application',
    },
    'application-rejected': {
      subject: 'Your Emberline application',
      heading: 'We cannot approve your application',
      greeting: 'Hello {name},',
      paragraphs: [
        'Thank you for applying with {organisationName}. After checking the application we are not able to approve it:',
        '{message}',
        'If you have questions about this decision, contact the network team through the Console.',
      ],
    },
    'organisation-suspended': {
      subject: '{organisationName} is paused on Emberline',
      heading: 'Your organisation is paused',
      greeting: 'Hello {name},',
      paragraphs: [
        '{organisationName} no longer appears in the Directory and cannot take new bookings for now.',
        'Reason: {reason}',
        'Once the reason is resolved, we will check it and reinstate you.',
      ],
      action: 'Open the Console',
    },
    'organisation-reinstated': {
      subject: '{organisationName} is active on Emberline again',
      heading: 'You are back in the Directory',
      greeting: 'Hello {name},',
      paragraphs: ['{organisationName} is active again: van owners can find and book you in the Directory.'],
      action: 'Open the Console',
    },
    'insurance-expiring': {
      subject: 'The insurance of {organisationName} expires on {expiresOn}',
      heading: 'Your insurance certificate expires soon',
      greeting: 'Hello {name},',
      paragraphs: [
        'The liability insurance certificate we hold for {organisationName} expires on {expiresOn}.',
        'Please upload the renewed certificate before then. Without valid insurance your organisation is paused and cannot take bookings.',
      ],
      action: 'Upload the new certificate',
    },
    'partner-suspended': {
      subject: '{organisationName} was suspended automatically',
      heading: '{organisationName} was suspended',
      greeting: 'Hello,',
      paragraphs: ['{organisationName} was suspended and no longer appears in the Directory.', 'Reason: {reason}'],
      action: 'Open the application',
    },
  },
};

export default en;
