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
    'coverage-alert-confirmed': TemplateMessages;
    'coverage-alert-match': TemplateMessages;
    'booking-requested': TemplateMessages;
    'booking-confirmed': TemplateMessages;
    'booking-reminder': TemplateMessages;
    'booking-rescheduled': TemplateMessages;
    'booking-cancelled': TemplateMessages;
    'booking-declined': TemplateMessages;
    'booking-expired': TemplateMessages;
    'booking-completed': TemplateMessages;
    'partner-booking-new': TemplateMessages;
    'partner-booking-cancelled': TemplateMessages;
    'partner-booking-rescheduled': TemplateMessages;
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
    'coverage-alert-confirmed': {
      subject: 'We will tell you when someone covers your area',
      heading: 'We will let you know',
      greeting: 'Hello,',
      paragraphs: [
        'No partner in the network does {serviceName} where you searched yet. As soon as one does, we will send you one e-mail with a link to them.',
        'We keep your e-mail address only for that message: it is deleted once we have written to you, or after {days} if nobody covers your area by then.',
      ],
      afterAction: ['If you did not ask for this, you can ignore this e-mail.'],
    },
    'coverage-alert-match': {
      subject: 'Someone now does {serviceName} in your area',
      heading: 'A partner now covers your area',
      greeting: 'Hello,',
      paragraphs: [
        'You asked us to tell you when a partner does {serviceName} where you searched. {organisationName} now works in your area.',
        'See their prices and next free times in the Directory.',
      ],
      action: 'See who can do it',
      afterAction: ['We have now deleted your e-mail address from this alert; we will not write again about it.'],
    },
    'booking-requested': {
      subject: 'Booking {reference} received: {serviceName} on {start}',
      heading: 'We have your booking',
      greeting: 'Hello {name},',
      paragraphs: [
        'Thank you. Your booking {reference} for {serviceName} with {partnerName} on {start} is with the partner now, and they will confirm it shortly.',
        'We have reserved {amount} on your card. Nothing is taken until the job is done, and the reservation is released if the partner cannot take the booking.',
      ],
      action: 'See your booking',
    },
    'booking-confirmed': {
      subject: 'Confirmed: {serviceName} on {start} ({reference})',
      heading: 'Your booking is confirmed',
      greeting: 'Hello {name},',
      paragraphs: [
        '{partnerName} has confirmed your booking {reference}: {serviceName} on {start}.',
        'Where: {place}',
        'The calendar invitation is attached, so you can add the appointment to your calendar.',
      ],
      action: 'See your booking',
    },
    'booking-reminder': {
      subject: 'Reminder: {serviceName} on {start}',
      heading: 'Your appointment is coming up',
      greeting: 'Hello {name},',
      paragraphs: [
        'A reminder of your booking {reference} with {partnerName}: {serviceName} on {start}.',
        'Where: {place}',
        'Please have the vehicle and its keys ready. If you need to change the appointment, open your booking.',
      ],
      action: 'See your booking',
    },
    'booking-rescheduled': {
      subject: 'Your booking {reference} has moved to {start}',
      heading: 'Your booking has a new time',
      greeting: 'Hello {name},',
      paragraphs: ['Your booking {reference} for {serviceName} with {partnerName} now starts on {start} instead of {previousStart}.'],
      action: 'See your booking',
    },
    'booking-cancelled': {
      subject: 'Booking {reference} cancelled',
      heading: 'Your booking is cancelled',
      greeting: 'Hello {name},',
      paragraphs: [
        'You have cancelled your booking {reference} for {serviceName} on {start}.',
        'Cancellation fee under the partner\'s policy: {fee}. Released from the reservation on your card: {refund}.',
      ],
      action: 'See your booking',
    },
    'booking-declined': {
      subject: 'Booking {reference} could not be taken',
      heading: 'The partner cannot take your booking',
      greeting: 'Hello {name},',
      paragraphs: [
        '{partnerName} cannot do {serviceName} on {start} (booking {reference}).',
        'Their reason: {reason}',
        'The reservation of {amount} on your card has been released; nothing was charged. You are welcome to book another time or another partner.',
      ],
      action: 'See your booking',
    },
    'booking-expired': {
      subject: 'Booking {reference} was not confirmed in time',
      heading: 'Your booking was not confirmed',
      greeting: 'Hello {name},',
      paragraphs: [
        '{partnerName} did not confirm your booking {reference} for {serviceName} on {start} before it was due to start.',
        'The reservation of {amount} on your card has been released; nothing was charged.',
      ],
      action: 'Find another time',
    },
    'booking-completed': {
      subject: 'Job done: {serviceName} ({reference}), your receipt',
      heading: 'Your job is done',
      greeting: 'Hello {name},',
      paragraphs: [
        '{partnerName} has finished {serviceName} (booking {reference}, booked for {start}).',
        'Receipt: {amount} was taken from your card on {completedAt}, for booking {reference} with {partnerName}.',
        'If something is not right with the work, your booking page shows how to reach {partnerName} and how to report a problem.',
      ],
      action: 'See your booking',
    },
    'partner-booking-new': {
      subject: 'New booking {reference}: {serviceName} on {start}',
      heading: 'A new booking',
      greeting: 'Hello {name},',
      paragraphs: [
        '{customerName} has booked {serviceName} on {start} (booking {reference}).',
        'Where: {place}',
        'The payment is reserved on the customer\'s card. Please confirm or decline the booking in the Console if it is waiting for you.',
      ],
      action: 'Open the booking',
    },
    'partner-booking-cancelled': {
      subject: 'Booking {reference} on {start} was cancelled',
      heading: 'A booking was cancelled',
      greeting: 'Hello {name},',
      paragraphs: ['{customerName} has cancelled booking {reference} for {serviceName} on {start}. The time is free again.', 'Cancellation fee charged under your policy: {fee}.'],
      action: 'Open the booking',
    },
    'partner-booking-rescheduled': {
      subject: 'Booking {reference} moved to {start}',
      heading: 'A booking has a new time',
      greeting: 'Hello {name},',
      paragraphs: ['Booking {reference} for {serviceName} ({customerName}) now starts on {start} instead of {previousStart}.'],
      action: 'Open the booking',
    },
  },
};

export default en;
