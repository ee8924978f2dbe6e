// Strings shared by both apps: brand, common states, errors and the safety cautions.
// Caution keys are the CautionCode values from @emberline/domain.
import { vatRulesEn } from './vat-rules';

const en = {
  vatRules: vatRulesEn,
  brand: {
    name: 'Emberline',
    network: 'Emberline Northern Network',
  },
  common: {
    loading: 'Loading…',
    retry: 'Try again',
    emptyTitle: 'Nothing here yet',
    errorTitle: 'This could not be loaded',
    close: 'Close',
    skipToContent: 'Skip to main content',
  },
  errors: {
    network: 'We could not reach Emberline. Check your connection, then try again.',
    unexpected: 'Something went wrong on our side. Please try again in a moment.',
    reference: 'Reference: {id}',
  },
  account: {
    name: 'Your name',
    email: 'E-mail address',
    password: 'Password',
    newPassword: 'New password',
    organisationName: 'Business name',
    passwordHint: 'At least 10 characters, not your e-mail address, not a common password.',
    signIn: 'Sign in',
    signingIn: 'Signing in…',
    signOut: 'Sign out',
    forgotPassword: 'Forgot your password?',
    sendLink: 'Send me a link',
    sendNewLink: 'Send a new link',
    sending: 'Sending…',
    linkSent: 'If an account exists for {email}, we have sent it a new link. It may take a minute to arrive; check your spam folder too.',
    resetSent: 'If an account exists for {email}, we have sent it a link to choose a new password. The link works for 30 minutes.',
    notVerified: 'Confirm your e-mail address first',
    notVerifiedText: 'Open the link in the e-mail we sent you. If it has expired or never arrived, we can send a new one.',
    createAccount: 'Create account',
    creating: 'Creating your account…',
    savePassword: 'Save new password',
    saving: 'Saving…',
    save: 'Save changes',
    saved: 'Your changes are saved.',
    language: 'Language',
    languages: { en: 'English', de: 'Deutsch (German)' },
    verified: 'Confirmed',
    notVerifiedTag: 'Not confirmed',
    emailState: 'E-mail address status',
    checkInboxTitle: 'Check your inbox',
    checkInboxText: 'We have sent a confirmation link to {email}. Open it to finish creating your account. The link works for 48 hours.',
    checkInboxNoEmail: 'We have sent you a confirmation link. Open it to finish creating your account. The link works for 48 hours.',
    noEmailYet: 'No e-mail yet?',
    verifyTitle: 'Confirm your e-mail address',
    verifying: 'Confirming your e-mail address…',
    verifiedTitle: 'Your e-mail address is confirmed',
    verifiedText: 'Welcome, {name}. You are signed in.',
    invalidLinkTitle: 'This link no longer works',
    invalidLinkText: 'Links work once and expire after a while. Enter your e-mail address and we will send you a new one.',
    missingToken: 'This link is incomplete. Copy the whole link from the e-mail, or ask for a new one.',
    resetTitle: 'Choose a new password',
    resetLead: 'This ends every session of your account; afterwards you sign in with the new password.',
    resetDone: 'Your password is changed. Sign in with your new password.',
    forgotTitle: 'Forgot your password?',
    forgotLead: 'Enter the e-mail address of your account and we will send you a link to choose a new password.',
    backToSignIn: 'Back to sign-in',
    needNewLink: 'Ask for a new link',
  },
  caution: {
    heading: 'Safety cautions',
    'exhaust-gas': {
      title: 'Exhaust gas (carbon monoxide)',
      text: 'Fuel-fired heaters make exhaust gas that contains carbon monoxide, which you cannot see or smell. Never run a heater in a closed garage or any enclosed space, and keep the exhaust outlet clear.',
    },
    'fuel-system': {
      title: 'Fuel and exhaust work',
      text: "Work on fuel lines, the fuel pump and the exhaust follows the heater maker's instructions and local regulations. Keep flames and sparks away from fuel.",
    },
    'vehicle-electrics': {
      title: 'Vehicle electrics',
      text: "Wiring, fuses and connections to the vehicle's electrical system follow the heater maker's instructions and local regulations.",
    },
    'stable-power-flashing': {
      title: 'Stable power while flashing',
      text: 'Firmware updates and coding run only with a stable external power supply (a battery support unit) connected, so the vehicle voltage never drops during the update.',
    },
    'hot-coolant': {
      title: 'Hot coolant',
      text: 'Coolant can be hot and under pressure. Let the engine and heater cool before the coolant circuit is opened, and bleed it as the maker describes.',
    },
    defer: "Emberline puts you in touch with technicians. It does not replace the heater maker's instructions, local codes or licensed practice: where they say otherwise, they apply.",
  },
};

export default en;
export type SharedMessages = typeof en;
