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
    'coverage-alert-confirmed': {
      subject: 'Wir sagen Ihnen Bescheid, sobald jemand Ihre Gegend abdeckt',
      heading: 'Wir melden uns',
      greeting: 'Hallo,',
      paragraphs: [
        'Dort, wo Sie gesucht haben, bietet noch kein Partner im Netzwerk {serviceName} an. Sobald das jemand tut, schicken wir Ihnen eine E-Mail mit einem Link zu ihm.',
        'Ihre E-Mail-Adresse behalten wir nur für diese Nachricht: Sie wird gelöscht, sobald wir Ihnen geschrieben haben, oder nach {days}, wenn bis dahin niemand Ihre Gegend abdeckt.',
      ],
      afterAction: ['Wenn Sie das nicht angefordert haben, können Sie diese E-Mail ignorieren.'],
    },
    'coverage-alert-match': {
      subject: '{serviceName} gibt es jetzt in Ihrer Gegend',
      heading: 'Ein Partner deckt jetzt Ihre Gegend ab',
      greeting: 'Hallo,',
      paragraphs: [
        'Sie wollten wissen, wann ein Partner dort, wo Sie gesucht haben, {serviceName} anbietet. {organisationName} arbeitet jetzt in Ihrer Gegend.',
        'Preise und nächste freie Termine finden Sie im Verzeichnis.',
      ],
      action: 'Anbieter ansehen',
      afterAction: ['Ihre E-Mail-Adresse haben wir aus dieser Benachrichtigung gelöscht; wir schreiben Ihnen dazu nicht noch einmal.'],
    },
    'booking-requested': {
      subject: 'Buchung {reference} eingegangen: {serviceName} am {start}',
      heading: 'Ihre Buchung ist eingegangen',
      greeting: 'Hallo {name},',
      paragraphs: [
        'Danke. Ihre Buchung {reference} für {serviceName} bei {partnerName} am {start} liegt jetzt beim Partner, der sie in Kürze bestätigt.',
        'Wir haben {amount} auf Ihrer Karte reserviert. Abgebucht wird erst, wenn der Auftrag erledigt ist; kann der Partner die Buchung nicht annehmen, wird die Reservierung freigegeben.',
      ],
      action: 'Buchung ansehen',
    },
    'booking-confirmed': {
      subject: 'Bestätigt: {serviceName} am {start} ({reference})',
      heading: 'Ihre Buchung ist bestätigt',
      greeting: 'Hallo {name},',
      paragraphs: [
        '{partnerName} hat Ihre Buchung {reference} bestätigt: {serviceName} am {start}.',
        'Ort: {place}',
        'Die Kalendereinladung hängt an, damit Sie den Termin in Ihren Kalender übernehmen können.',
      ],
      action: 'Buchung ansehen',
    },
    'booking-reminder': {
      subject: 'Erinnerung: {serviceName} am {start}',
      heading: 'Ihr Termin steht bevor',
      greeting: 'Hallo {name},',
      paragraphs: [
        'Eine Erinnerung an Ihre Buchung {reference} bei {partnerName}: {serviceName} am {start}.',
        'Ort: {place}',
        'Bitte halten Sie das Fahrzeug und die Schlüssel bereit. Möchten Sie den Termin ändern, öffnen Sie Ihre Buchung.',
      ],
      action: 'Buchung ansehen',
    },
    'booking-rescheduled': {
      subject: 'Ihre Buchung {reference} ist auf {start} verschoben',
      heading: 'Ihre Buchung hat einen neuen Termin',
      greeting: 'Hallo {name},',
      paragraphs: ['Ihre Buchung {reference} für {serviceName} bei {partnerName} beginnt jetzt am {start} statt am {previousStart}.'],
      action: 'Buchung ansehen',
    },
    'booking-cancelled': {
      subject: 'Buchung {reference} storniert',
      heading: 'Ihre Buchung ist storniert',
      greeting: 'Hallo {name},',
      paragraphs: [
        'Sie haben Ihre Buchung {reference} für {serviceName} am {start} storniert.',
        'Stornogebühr nach den Bedingungen des Partners: {fee}. Von der Reservierung auf Ihrer Karte freigegeben: {refund}.',
      ],
      action: 'Buchung ansehen',
    },
    'booking-declined': {
      subject: 'Buchung {reference} konnte nicht angenommen werden',
      heading: 'Der Partner kann Ihre Buchung nicht annehmen',
      greeting: 'Hallo {name},',
      paragraphs: [
        '{partnerName} kann {serviceName} am {start} nicht übernehmen (Buchung {reference}).',
        'Begründung: {reason}',
        'Die Reservierung von {amount} auf Ihrer Karte ist freigegeben; abgebucht wurde nichts. Buchen Sie gern einen anderen Termin oder einen anderen Partner.',
      ],
      action: 'Buchung ansehen',
    },
    'booking-expired': {
      subject: 'Buchung {reference} wurde nicht rechtzeitig bestätigt',
      heading: 'Ihre Buchung wurde nicht bestätigt',
      greeting: 'Hallo {name},',
      paragraphs: [
        '{partnerName} hat Ihre Buchung {reference} für {serviceName} am {start} nicht vor dem Termin bestätigt.',
        'Die Reservierung von {amount} auf Ihrer Karte ist freigegeben; abgebucht wurde nichts.',
      ],
      action: 'Anderen Termin finden',
    },
    'booking-completed': {
      subject: 'Auftrag erledigt: {serviceName} ({reference}), Ihr Beleg',
      heading: 'Ihr Auftrag ist erledigt',
      greeting: 'Hallo {name},',
      paragraphs: [
        '{partnerName} hat {serviceName} erledigt (Buchung {reference}, gebucht für {start}).',
        'Beleg: {amount} wurden am {completedAt} von Ihrer Karte abgebucht, für die Buchung {reference} bei {partnerName}.',
        'Wenn an der Arbeit etwas nicht stimmt: Auf der Buchungsseite finden Sie, wie Sie {partnerName} erreichen und ein Problem melden.',
      ],
      action: 'Buchung ansehen',
    },
    'partner-booking-new': {
      subject: 'Neue Buchung {reference}: {serviceName} am {start}',
      heading: 'Eine neue Buchung',
      greeting: 'Hallo {name},',
      paragraphs: [
        '{customerName} hat {serviceName} am {start} gebucht (Buchung {reference}).',
        'Ort: {place}',
        'Die Zahlung ist auf der Karte der Kundin oder des Kunden reserviert. Bitte bestätigen oder lehnen Sie die Buchung in der Console ab, falls sie auf Sie wartet.',
      ],
      action: 'Buchung öffnen',
    },
    'partner-booking-cancelled': {
      subject: 'Buchung {reference} am {start} wurde storniert',
      heading: 'Eine Buchung wurde storniert',
      greeting: 'Hallo {name},',
      paragraphs: ['{customerName} hat die Buchung {reference} für {serviceName} am {start} storniert. Der Termin ist wieder frei.', 'Nach Ihren Bedingungen berechnete Stornogebühr: {fee}.'],
      action: 'Buchung öffnen',
    },
    'partner-booking-rescheduled': {
      subject: 'Buchung {reference} auf {start} verschoben',
      heading: 'Eine Buchung hat einen neuen Termin',
      greeting: 'Hallo {name},',
      paragraphs: ['Die Buchung {reference} für {serviceName} ({customerName}) beginnt jetzt am {start} statt am {previousStart}.'],
      action: 'Buchung öffnen',
    },
  },
};

export default de;
