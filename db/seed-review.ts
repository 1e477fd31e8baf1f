import "server-only";
/**
 * Demo review history for Brookmere Biofluidics (invented): the gradient
 * generator's second revision goes all the way to tape-out clearance, the
 * droplet generator's sits with the fluidics reviewer with one flag already
 * waived, and the serpentine mixer's has just been submitted. Every step goes
 * through lib/review/service, so states, audit events, inbox rows and outbox
 * e-mails are what the app itself would write.
 */
import { and, eq } from "drizzle-orm";
import { getDb } from "./index";
import { chips, revisions } from "./schema-chips";
import { memberContext } from "./seed-chips";
import { DEMO_PASSWORD, type DemoContext, type SeedStep } from "./seed";
import { loadReview, takeReviewStep } from "@/lib/review/service";
import { flagKey } from "@/lib/review/machine";

async function revisionId(demo: DemoContext, chipName: string, number: number): Promise<number | null> {
  const rows = await getDb()
    .select({ id: revisions.id })
    .from(revisions)
    .innerJoin(chips, eq(chips.id, revisions.chipId))
    .where(and(eq(chips.workspaceId, demo.workspaces.brookmere.id), eq(chips.name, chipName), eq(revisions.number, number)))
    .limit(1);
  return rows[0]?.id ?? null;
}

export const seedReviewStep: SeedStep = {
  name: "demo review history",
  run: async (demo) => {
    const designer = await memberContext(demo, "designer@brookmere.test", "brookmere");
    const reviewer = await memberContext(demo, "reviewer@brookmere.test", "brookmere");
    const fab = await memberContext(demo, "fab@brookmere.test", "brookmere");
    const version = async (id: number) => (await loadReview(designer, id)).state.version;

    const cleared = await revisionId(demo, "Gradient generator GG-3", 2);
    if (cleared !== null) {
      await takeReviewStep(designer, cleared, {
        type: "submit",
        expectedVersion: await version(cleared),
        note: "Longer mixing serpentines in the tree; the mixing flags of revision 1 are gone. Ready for fab.",
      });
      const loaded = await loadReview(reviewer, cleared);
      for (const flag of loaded.analysisDoc?.flags.filter((f) => f.severity !== "info") ?? []) {
        await takeReviewStep(reviewer, cleared, {
          type: "dispose_flag",
          expectedVersion: await version(cleared),
          flagKey: flagKey(flag),
          decision: "waived",
          justification: "Checked against the bench prototype of revision 1; acceptable for this perfusion assay.",
        });
      }
      await takeReviewStep(reviewer, cleared, { type: "pass_fluidics", expectedVersion: await version(cleared), note: "Every branch mixes within its serpentine at the perfusion flow." });
      await takeReviewStep(fab, cleared, {
        type: "clear",
        expectedVersion: await version(cleared),
        fabName: "Northbank Microfab (invented)",
        process: "PDMS soft lithography, SU-8 mould, plasma bond to glass",
        password: DEMO_PASSWORD,
      });
    }

    const droplet = await revisionId(demo, "Droplet generator DG-1", 2);
    if (droplet !== null) {
      await takeReviewStep(designer, droplet, {
        type: "submit",
        expectedVersion: await version(droplet),
        note: "Orifice widened to 55 µm for larger droplets; please check the high-throughput point.",
      });
      const loaded = await loadReview(reviewer, droplet);
      const first = loaded.analysisDoc?.flags[0];
      if (first) {
        await takeReviewStep(reviewer, droplet, {
          type: "dispose_flag",
          expectedVersion: await version(droplet),
          flagKey: flagKey(first),
          decision: "waived",
          justification: "Squeezing-regime break-up is what this design intends at the nominal capillary number.",
        });
      }
    }

    const mixer = await revisionId(demo, "Serpentine mixer SM-2", 2);
    if (mixer !== null) {
      await takeReviewStep(designer, mixer, {
        type: "submit",
        expectedVersion: await version(mixer),
        note: "Lengthened the serpentine so the two streams mix before the detection window.",
      });
    }
  },
};
