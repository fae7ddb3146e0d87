import { expect, type Locator, type Page } from '@playwright/test';

/** /demo/mailbox: mails caught by the fake SMTP server. */
export class MailboxPage {
  readonly mails: Locator;

  constructor(readonly page: Page) {
    this.mails = page.getByTestId('mail');
  }

  async goto() {
    await this.page.goto('/demo/mailbox');
    // while the streamed page replaces its loading state, React briefly keeps a hidden copy of
    // the content at the end of the body: look at the shown one only
    await expect(this.page.getByTestId('mailbox').filter({ visible: true })).toBeVisible();
  }

  /** The newest mail to `email` (reloads until it arrives). */
  async latestMailTo(email: string): Promise<Locator> {
    const mail = this.mails.filter({ has: this.page.getByTestId('mail-to').getByText(email) }).first();
    await expect(async () => {
      await this.page.reload();
      await expect(mail).toBeVisible({ timeout: 1000 });
    }).toPass({ timeout: 30_000 });
    return mail;
  }
}
