import "server-only";
import { desc, eq } from "drizzle-orm";
import { getDb } from "../client";
import { uploads, users } from "../schema";

/** The raw file is kept with who uploaded it and when; only files that passed every check are stored. */
export async function insertUpload(input: {
  projectId: string;
  scenarioId: string;
  kind: string;
  filename: string;
  contentType: string;
  content: Buffer;
  rowCount: number;
  userId: string;
}) {
  return getDb().transaction(async (tx) => {
    const [row] = await tx
      .insert(uploads)
      .values({
        projectId: input.projectId,
        scenarioId: input.scenarioId,
        kind: input.kind,
        filename: input.filename,
        contentType: input.contentType,
        sizeBytes: input.content.length,
        content: input.content,
        rowCount: input.rowCount,
        uploadedById: input.userId,
      })
      .returning({ id: uploads.id, uploadedAt: uploads.uploadedAt });
    return row;
  });
}

export async function listUploads({ scenarioId }: { scenarioId: string }) {
  return getDb()
    .select({ id: uploads.id, kind: uploads.kind, filename: uploads.filename, sizeBytes: uploads.sizeBytes, rowCount: uploads.rowCount, uploadedAt: uploads.uploadedAt, uploadedByName: users.name })
    .from(uploads)
    .innerJoin(users, eq(users.id, uploads.uploadedById))
    .where(eq(uploads.scenarioId, scenarioId))
    .orderBy(desc(uploads.uploadedAt), desc(uploads.id))
    .limit(20);
}
