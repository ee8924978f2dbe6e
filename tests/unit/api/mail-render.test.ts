// E-mail rendering: both parts, placeholders, escaping, safe links, locales and catalogue parity.
import { describe, expect, it } from 'vitest';
import en from '../../../apps/api/src/mail/messages/en';
import de from '../../../apps/api/src/mail/messages/de';
import { ACTION_LINK, MAIL_TEMPLATES, MailRenderError, renderMail, resolveMailLocale, type MailTemplate, type MailTemplateData } from '../../../apps/api/src/mail/render';

const link = 'https://emberline.test/verify-email?token=abc123';
const when = { at: '2027-01-12T08:00:00.000Z', timeZone: 'Europe/Vienna' };
const money = (minor: number) => ({ minor, currency: 'EUR' });
const samples: { [T in MailTemplate]: MailTemplateData[T] } = {
  'verify-email': { name: 'Anna', link },
  'reset-password': { name: 'Anna', link, minutes: 30 },
  invitation: { inviterName: 'Jonas Berger', organisationName: 'Nordlicht Mobile Heating', role: 'technician', link, days: 7 },
  'account-locked': { name: 'Anna', minutes: 15, resetLink: link },
  'password-changed': { name: 'Anna' },
  'application-submitted': { organisationName: 'Nordlicht Mobile Heating', link },
  'application-approved': { name: 'Anna', organisationName: 'Nordlicht Mobile Heating', link },
  'application-changes-requested': { name: 'Anna', organisationName: 'Nordlicht Mobile Heating', message: 'Please upload a readable registration extract.', link },
  'application-rejected': { name: 'Anna', organisationName: 'Nordlicht Mobile Heating', message: 'The equipment evidence does not show a flashing interface.' },
  'organisation-suspended': { name: 'Anna', organisationName: 'Nordlicht Mobile Heating', reason: 'insurance expired', link },
  'organisation-reinstated': { name: 'Anna', organisationName: 'Nordlicht Mobile Heating', link },
  'insurance-expiring': { name: 'Anna', organisationName: 'Nordlicht Mobile Heating', expiresOn: '2027-03-01', link },
  'partner-suspended': { organisationName: 'Nordlicht Mobile Heating', reason: 'insurance expired', link },
  'coverage-alert-confirmed': { serviceName: 'Parking heater conversion', days: 365 },
  'coverage-alert-match': { serviceName: 'Parking heater conversion', organisationName: 'Nordlicht Mobile Heating', link },
  'booking-requested': { name: 'Anna', reference: 'EMB-K7Q2MX', serviceName: 'Parking heater conversion', partnerName: 'Nordlicht Mobile Heating', start: when, amount: money(33_432), link },
  'booking-confirmed': { name: 'Anna', reference: 'EMB-K7Q2MX', serviceName: 'Parking heater conversion', partnerName: 'Nordlicht Mobile Heating', start: when, place: 'Museumstraße 5, 6020 Innsbruck', link },
  'booking-reminder': { name: 'Anna', reference: 'EMB-K7Q2MX', serviceName: 'Parking heater conversion', partnerName: 'Nordlicht Mobile Heating', start: when, place: 'Museumstraße 5, 6020 Innsbruck', link },
  'booking-rescheduled': { name: 'Anna', reference: 'EMB-K7Q2MX', serviceName: 'Parking heater conversion', partnerName: 'Nordlicht Mobile Heating', start: when, previousStart: when, link },
  'booking-cancelled': { name: 'Anna', reference: 'EMB-K7Q2MX', serviceName: 'Parking heater conversion', start: when, fee: money(2000), refund: money(31_432), link },
  'booking-declined': { name: 'Anna', reference: 'EMB-K7Q2MX', serviceName: 'Parking heater conversion', partnerName: 'Nordlicht Mobile Heating', start: when, reason: 'The technician is ill', amount: money(33_432), link },
  'booking-expired': { name: 'Anna', reference: 'EMB-K7Q2MX', serviceName: 'Parking heater conversion', partnerName: 'Nordlicht Mobile Heating', start: when, amount: money(33_432), link },
  'booking-completed': { name: 'Anna', reference: 'EMB-K7Q2MX', serviceName: 'Parking heater conversion', partnerName: 'Nordlicht Mobile Heating', start: when, completedAt: when, amount: money(33_432), link },
  'partner-booking-new': { name: 'Jonas', reference: 'EMB-K7Q2MX', serviceName: 'Parking heater conversion', start: when, customerName: 'Anna Berg', place: 'Museumstraße 5, 6020 Innsbruck', link },
  'partner-booking-cancelled': { name: 'Jonas', reference: 'EMB-K7Q2MX', serviceName: 'Parking heater conversion', start: when, customerName: 'Anna Berg', fee: money(0), link },
  'partner-booking-rescheduled': { name: 'Jonas', reference: 'EMB-K7Q2MX', serviceName: 'Parking heater conversion', start: when, previousStart: when, customerName: 'Anna Berg', link },
};
const render = <T extends MailTemplate>(template: T, locale = 'en', data: Partial<MailTemplateData[T]> = {}) =>
  renderMail(template, locale, { ...samples[template], ...data } as MailTemplateData[T]);

const placeholders = (s: string) => [...s.matchAll(/\{(\w+)\}/g)].map((m) => m[1]).sort();

describe('renderMail', () => {
  it.each(MAIL_TEMPLATES.flatMap((t) => [[t, 'en'], [t, 'de']] as const))('%s (%s) has a subject, a text and an HTML part with every placeholder filled', (template, locale) => {
    const mail = render(template, locale);
    expect(mail.subject).toBe(mail.subject.trim());
    expect(mail.subject.length).toBeGreaterThan(10);
    expect(mail.text).not.toMatch(/<[a-z]/i);
    expect(mail.html).toMatch(/^<!doctype html>/);
    expect(mail.html).toContain(`<html lang="${locale}">`);
    for (const part of [mail.subject, mail.text, mail.html]) expect(part).not.toMatch(/\{\w+\}/);
    expect(mail.text).toContain('Emberline');
  });

  it('fills the values into both parts and writes the link out in text and HTML', () => {
    const mail = render('verify-email', 'en', { name: 'Mira Okafor' });
    expect(mail.subject).toBe('Confirm your e-mail address for Emberline');
    expect(mail.text).toContain('Hello Mira Okafor,');
    expect(mail.text).toContain(`Confirm my e-mail address:\n${link}`);
    expect(mail.html).toContain('Hello Mira Okafor,');
    // once on the button, once written out under it
    expect(mail.html.split(`href="${link}"`)).toHaveLength(3);
    expect(mail.html).toContain(`>${link}</a>`);
  });

  it('uses the house colours and typeface inline, for mail clients that drop <style>', () => {
    const { html } = render('reset-password');
    expect(html).not.toContain('<style');
    expect(html).toMatch(/background-color:#c2410c;[^"]*"><a href=/);
    expect(html).toContain('color:#1e293b');
    expect(html).toContain("font-family:'Lato'");
    expect(html).toContain('<h1 ');
    expect(html).toContain('role="presentation"');
  });

  it('has no button and no link where the template carries none', () => {
    const mail = render('password-changed');
    expect(ACTION_LINK['password-changed']).toBeNull();
    expect(mail.html).not.toContain('<a ');
    expect(mail.text).not.toMatch(/https?:/);
  });

  it('HTML-escapes every interpolated value but keeps the text part plain', () => {
    const name = '<script>alert("x")</script> & Co\'s';
    const mail = render('invitation', 'en', { inviterName: name, organisationName: '<b>Heat</b>' });
    expect(mail.html).not.toContain('<script>');
    expect(mail.html).not.toContain('<b>Heat</b>');
    expect(mail.html).toContain('&#60;script&#62;alert(&#34;x&#34;)&#60;/script&#62; &#38; Co&#39;s');
    expect(mail.text).toContain(`${name} has invited you to join <b>Heat</b>`);
  });

  it('cannot be broken out of the href attribute', () => {
    const mail = render('verify-email', 'en', { link: 'https://emberline.test/v?t=1&x="><img src=x onerror=alert(1)>' });
    expect(mail.html).not.toMatch(/<img/i);
    expect(mail.html.match(/<a /g)).toHaveLength(2);
    const hrefs = [...mail.html.matchAll(/href="([^"]*)"/g)].map((m) => m[1]);
    expect(hrefs).toEqual([hrefs[0], hrefs[0]]);
    expect(hrefs[0]).toMatch(/^https:\/\/emberline\.test\/v\?t=1&#38;x=[^<>"]*onerror=alert\(1\)[^<>"]*$/);
  });

  it.each(['javascript:alert(1)', 'data:text/html,<b>hi</b>', 'ftp://files.example/x', '/relative/path', 'mailto:a@example.org', ''])('refuses the link %j', (bad) => {
    expect(() => render('verify-email', 'en', { link: bad })).toThrow(MailRenderError);
    expect(() => render('account-locked', 'en', { resetLink: bad })).toThrow(/http\(s\)/);
  });

  it('keeps the subject on one line whatever a name contains (a newline would start a new header)', () => {
    const mail = render('invitation', 'en', { inviterName: 'Eve\r\nBcc: everyone@example.org' });
    expect(mail.subject).not.toMatch(/[\r\n]/);
  });

  it('uses German when asked, also for a regional tag, and English for anything unknown', () => {
    expect(render('reset-password', 'de').subject).toBe(de.templates['reset-password'].subject);
    expect(render('reset-password', 'de-AT').text).toContain('Hallo Anna,');
    expect(render('reset-password', 'fr').subject).toBe(en.templates['reset-password'].subject);
    expect(resolveMailLocale('DE_de')).toBe('de');
  });

  // unit names and plural forms come from Intl.NumberFormat (ECMA-402 with CLDR data)
  it('writes durations with their unit and plural in the mail language', () => {
    expect(render('reset-password', 'en', { minutes: 30 }).text).toContain('for 30 minutes.');
    expect(render('reset-password', 'de', { minutes: 30 }).text).toContain('30 Minuten lang');
    expect(render('invitation', 'en', { days: 1 }).text).toContain('valid for 1 day.');
    expect(render('invitation', 'de', { days: 7 }).text).toContain('7 Tage lang');
  });

  // currency and date formats from Intl (ECMA-402 with CLDR data); 08:00 UTC is 09:00 in Vienna in January (CET, UTC+1)
  it('writes money with its currency and a start as local time in the job\'s zone, in the mail language', () => {
    const en = render('booking-cancelled', 'en', { fee: money(2000), refund: money(31_432) }).text;
    expect(en).toContain('€20.00');
    expect(en).toContain('€314.32');
    for (const part of ['Tuesday', 'January', '12', '2027', '09:00']) expect(en).toContain(part);
    const de = render('booking-cancelled', 'de', { fee: money(2000), refund: money(31_432) }).text;
    expect(de).toContain('20,00\u00a0€');
    for (const part of ['Dienstag', '12. Januar 2027', '09:00']) expect(de).toContain(part);
  });

  it('names the role in the mail language', () => {
    expect(render('invitation', 'en', { role: 'partner_admin' }).text).toContain('as partner admin.');
    expect(render('invitation', 'de', { role: 'partner_admin' }).text).toContain('als Partner-Admin beizutreten');
  });

  // RFC 3676 section 4.3: "-- " on its own line separates the signature in plain-text mail
  it('separates the footer with the standard signature delimiter', () => {
    expect(render('verify-email').text).toContain('\n-- \nThis is an automatic message');
  });
});

describe('the message catalogue', () => {
  const strings = (t: (typeof en.templates)[MailTemplate]) => [t.subject, t.heading, t.greeting, ...t.paragraphs, t.action ?? '', ...(t.afterAction ?? [])];

  it('has the same templates, and the same placeholders in each string, in English and German', () => {
    expect(Object.keys(de.templates).sort()).toEqual(Object.keys(en.templates).sort());
    expect(Object.keys(de.roles).sort()).toEqual(Object.keys(en.roles).sort());
    for (const template of MAIL_TEMPLATES) {
      const enStrings = strings(en.templates[template]);
      const deStrings = strings(de.templates[template]);
      expect(deStrings.length, template).toBe(enStrings.length);
      enStrings.forEach((s, i) => expect(placeholders(deStrings[i]!), `${template} #${i}`).toEqual(placeholders(s)));
    }
  });

  it('has a button label exactly where a template carries a link', () => {
    for (const template of MAIL_TEMPLATES) {
      for (const catalogue of [en, de]) expect(Boolean(catalogue.templates[template].action), template).toBe(ACTION_LINK[template] !== null);
    }
  });

  it('uses only placeholders that the template data provides', () => {
    for (const template of MAIL_TEMPLATES) {
      const provided = Object.keys(samples[template]);
      for (const s of strings(en.templates[template])) for (const p of placeholders(s)) expect(provided, `${template}: {${p}}`).toContain(p);
    }
  });

  it('avoids the characters vue-i18n treats as syntax (linked messages, plurals)', () => {
    for (const catalogue of [en, de]) {
      for (const template of MAIL_TEMPLATES) for (const s of strings(catalogue.templates[template])) expect(s).not.toMatch(/[@|]/);
    }
  });
});
