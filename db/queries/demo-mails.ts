import 'server-only';
import { desc } from 'drizzle-orm';
import { getDb } from '../client';
import { demoMails, type DemoMail } from '../schema';

export async function insertDemoMail(m: Omit<DemoMail, 'id' | 'createdAt'>): Promise<DemoMail> {
  const db = await getDb();
  const [row] = await db.insert(demoMails).values(m).returning();
  return row!;
}

/** Newest first, without the raw source. */
export async function listDemoMails(limit = 100) {
  const db = await getDb();
  return db
    .select({
      id: demoMails.id,
      from: demoMails.from,
      to: demoMails.to,
      subject: demoMails.subject,
      text: demoMails.text,
      html: demoMails.html,
      createdAt: demoMails.createdAt,
    })
    .from(demoMails)
    .orderBy(desc(demoMails.createdAt), desc(demoMails.id))
    .limit(limit);
}
