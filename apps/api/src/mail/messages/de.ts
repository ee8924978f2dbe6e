// German e-mail messages, the same keys and placeholders as en.ts.
import type { MailMessages } from './en';

const de: MailMessages = {
  common: {
    linkHint: 'Falls die Schaltfläche nicht funktioniert, kopieren Sie diese Adresse in Ihren Browser:',
    signOff: 'Viele Grüße',
    signature: 'Emberline',
    footer: 'Dies ist eine automatische Nachricht von Emberline. Antworten an diese Adresse werden nicht gelesen.',
  },
  roles: {
    partner_admin: 'Partner-Admin',
    technician: 'Techniker/in',
  },
  templates: {
    'verify-email': {
      subject: 'Bestätigen Sie Ihre E-Mail-Adresse für Emberline',
      heading: 'Bestätigen Sie Ihre E-Mail-Adresse',
      greeting: 'Hallo {name},',
      paragraphs: [
        'Danke für Ihre Anmeldung. Bitte bestätigen Sie, dass dies Ihre E-Mail-Adresse ist, damit wir Ihnen Buchungsbestätigungen und Auftragsberichte schicken können.',
      ],
      action: 'E-Mail-Adresse bestätigen',
      afterAction: ['Wenn Sie kein Emberline-Konto angelegt haben, können Sie diese E-Mail ignorieren.'],
    },
    'reset-password': {
      subject: 'Ihr Emberline-Passwort zurücksetzen',
      heading: 'Passwort zurücksetzen',
      greeting: 'Hallo {name},',
      paragraphs: [
        'Wir haben eine Anfrage erhalten, das Passwort Ihres Emberline-Kontos zurückzusetzen. Über die Schaltfläche unten wählen Sie ein neues. Der Link gilt einmal und {minutes} lang.',
      ],
      action: 'Neues Passwort wählen',
      afterAction: ['Wenn Sie das nicht angefordert haben, können Sie diese E-Mail ignorieren: Ihr Passwort bleibt unverändert.'],
    },
    invitation: {
      subject: '{inviterName} lädt Sie zu {organisationName} auf Emberline ein',
      heading: 'Einladung zu {organisationName}',
      greeting: 'Hallo,',
      paragraphs: [
        '{inviterName} hat Sie eingeladen, {organisationName} auf Emberline als {role} beizutreten.',
        'Nehmen Sie die Einladung an, um Ihr Konto einzurichten. Die Einladung gilt {days} lang.',
      ],
      action: 'Einladung annehmen',
      afterAction: ['Wenn Sie diese Einladung nicht erwartet haben, können Sie diese E-Mail ignorieren.'],
    },
    'account-locked': {
      subject: 'Ihr Emberline-Konto ist vorübergehend gesperrt',
      heading: 'Ihr Konto ist vorübergehend gesperrt',
      greeting: 'Hallo {name},',
      paragraphs: [
        'Es gab mehrere fehlgeschlagene Anmeldeversuche für Ihr Konto. Zum Schutz haben wir es für {minutes} gesperrt. Danach können Sie sich wieder anmelden.',
        'Wenn Sie das nicht waren, versucht vielleicht jemand, Ihr Passwort zu erraten. Wählen Sie sicherheitshalber jetzt ein neues Passwort.',
      ],
      action: 'Neues Passwort wählen',
    },
    'password-changed': {
      subject: 'Ihr Emberline-Passwort wurde geändert',
      heading: 'Ihr Passwort wurde geändert',
      greeting: 'Hallo {name},',
      paragraphs: [
        'Das Passwort Ihres Emberline-Kontos wurde soeben geändert.',
        'Wenn Sie das waren, ist nichts weiter zu tun.',
        'Wenn nicht, wählen Sie bitte sofort über „Passwort vergessen?“ auf der Anmeldeseite ein neues Passwort.',
      ],
    },
  },
};

export default de;
