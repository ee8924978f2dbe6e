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
    'application-submitted': {
      subject: 'Neue Partnerbewerbung: {organisationName}',
      heading: '{organisationName} hat sich beworben',
      greeting: 'Hallo,',
      paragraphs: ['{organisationName} hat die Bewerbung für das Netzwerk eingereicht. Sie wartet in der Prüfliste.'],
      action: 'Bewerbung prüfen',
    },
    'application-approved': {
      subject: '{organisationName} ist bei Emberline freigegeben',
      heading: 'Willkommen im Netzwerk',
      greeting: 'Hallo {name},',
      paragraphs: [
        'Gute Nachricht: Wir haben die Bewerbung von {organisationName} geprüft und freigegeben.',
        'Fahrzeughalter finden Sie jetzt im Verzeichnis. Richten Sie Ihre Leistungen, Preise und Arbeitszeiten ein, damit man Sie buchen kann.',
      ],
      action: 'Console öffnen',
    },
    'application-changes-requested': {
      subject: 'Ihre Emberline-Bewerbung braucht noch Änderungen',
      heading: 'Bitte noch ein paar Änderungen',
      greeting: 'Hallo {name},',
      paragraphs: [
        'Wir haben die Bewerbung von {organisationName} angesehen und brauchen noch ein paar Änderungen, bevor wir sie freigeben können:',
        '{message}',
        'Unsere Hinweise finden Sie neben den betroffenen Feldern. Ändern Sie die Angaben und reichen Sie die Bewerbung erneut ein.',
      ],
      action: 'Bewerbung bearbeiten',
    },
    'application-rejected': {
      subject: 'Ihre Emberline-Bewerbung',
      heading: 'Wir können Ihre Bewerbung nicht freigeben',
      greeting: 'Hallo {name},',
      paragraphs: [
        'Danke für die Bewerbung von {organisationName}. Nach der Prüfung können wir sie leider nicht freigeben:',
        '{message}',
        'Wenn Sie Fragen zu dieser Entscheidung haben, wenden Sie sich über die Console an das Netzwerk-Team.',
      ],
    },
    'organisation-suspended': {
      subject: '{organisationName} ist bei Emberline pausiert',
      heading: 'Ihre Organisation ist pausiert',
      greeting: 'Hallo {name},',
      paragraphs: [
        '{organisationName} erscheint vorerst nicht mehr im Verzeichnis und kann keine neuen Buchungen annehmen.',
        'Grund: {reason}',
        'Sobald der Grund behoben ist, prüfen wir das und schalten Sie wieder frei.',
      ],
      action: 'Console öffnen',
    },
    'organisation-reinstated': {
      subject: '{organisationName} ist bei Emberline wieder aktiv',
      heading: 'Sie sind wieder im Verzeichnis',
      greeting: 'Hallo {name},',
      paragraphs: ['{organisationName} ist wieder aktiv: Fahrzeughalter finden und buchen Sie im Verzeichnis.'],
      action: 'Console öffnen',
    },
    'insurance-expiring': {
      subject: 'Die Versicherung von {organisationName} läuft am {expiresOn} ab',
      heading: 'Ihr Versicherungsnachweis läuft bald ab',
      greeting: 'Hallo {name},',
      paragraphs: [
        'Der Haftpflicht-Versicherungsnachweis, den wir für {organisationName} haben, läuft am {expiresOn} ab.',
        'Bitte laden Sie den verlängerten Nachweis vorher hoch. Ohne gültige Versicherung wird Ihre Organisation pausiert und kann keine Buchungen annehmen.',
      ],
      action: 'Neuen Nachweis hochladen',
    },
    'partner-suspended': {
      subject: '{organisationName} wurde automatisch gesperrt',
      heading: '{organisationName} wurde gesperrt',
      greeting: 'Hallo,',
      paragraphs: ['{organisationName} wurde gesperrt und erscheint nicht mehr im Verzeichnis.', 'Grund: {reason}'],
      action: 'Bewerbung öffnen',
    },
  },
};

export default de;
