/**
 * Rules about streams meeting: droplet break-up regime by capillary number where
 * the two phases meet, and incomplete diffusive mixing where two inlet streams
 * meet. Phases come from conditions.ports[name].phase ("dispersed" for the
 * second phase; everything else carries the continuous `fluid`).
 */
import type { ChannelNetwork } from "../network/types";
import type { Conditions } from "../analysis/conditions";
import type { Flag, HydraulicsResult } from "../hydraulics/types";
import { buildFlowGraph, tagInletStreams } from "../hydraulics/flow-paths";
import { makeFlag, ruleDefinition, thresholdFor } from "./registry";
import { num } from "./format";

/** Droplet-regime and mixing flags. */
export function evaluateStreamFlags(network: ChannelNetwork, h: HydraulicsResult, conditions: Conditions): Flag[] {
  const flags: Flag[] = [];
  const graph = buildFlowGraph(network, h);
  const { inlets, segmentMask } = tagInletStreams(network, h, graph);
  let dispersedBits = 0;
  inlets.forEach((name, b) => {
    const drive = conditions.ports?.[name] as { phase?: string } | undefined;
    if (drive?.phase === "dispersed") dispersedBits |= 1 << Math.min(b, 30);
  });
  const allBits = inlets.reduce((m, _n, b) => m | (1 << Math.min(b, 30)), 0);
  const continuousBits = allBits & ~dispersedBits;
  const nodeAt = (i: number) => ({ xM: network.nodes[i].xM, yM: network.nodes[i].yM });

  if (h.secondPhase && dispersedBits === 0) {
    flags.push(makeFlag("droplet_phases_untagged", { target: { kind: "chip", id: null }, value: null, threshold: null, message: `A second phase (${h.secondPhase.name}) is given, but no port is marked "phase": "dispersed", so Stokeline cannot tell where droplets form. Mark the inlets that carry ${h.secondPhase.name}.` }));
  }

  const tSq = thresholdFor("droplet_squeezing", conditions, ruleDefinition("droplet_squeezing").defaultThreshold!);
  const tDrip = thresholdFor("droplet_dripping", conditions, ruleDefinition("droplet_dripping").defaultThreshold!);
  const tJet = thresholdFor("droplet_jetting", conditions, ruleDefinition("droplet_jetting").defaultThreshold!);
  const tMix = thresholdFor("mixing_incomplete", conditions, ruleDefinition("mixing_incomplete").defaultThreshold!);

  for (let i = 0; i < network.nodes.length; i++) {
    const incoming = graph.into[i];
    if (incoming.length < 2) continue;
    const node = network.nodes[i];
    // Two-phase junction: one incoming stream only continuous, another only dispersed.
    if (h.secondPhase && dispersedBits) {
      const cont = incoming.filter(([k]) => segmentMask[k] !== 0 && (segmentMask[k] & ~continuousBits) === 0);
      const disp = incoming.filter(([k]) => segmentMask[k] !== 0 && (segmentMask[k] & ~dispersedBits) === 0);
      if (cont.length && disp.length) {
        // Ca of the continuous phase at the junction: its fastest incoming stream (Garstecki et al. 2006 use the continuous-phase speed).
        let ca = 0;
        let via = "";
        for (const [k] of cont) if (h.segments[k].capillary > ca) { ca = h.segments[k].capillary; via = network.segments[k].id; }
        const target = { kind: "node" as const, id: node.id };
        const at = nodeAt(i);
        const base = `Where ${h.secondPhase.name} meets ${h.fluid.name} at node ${node.id}, Ca = ${num(ca)} (continuous phase in segment ${via}, interfacial tension ${(h.interfacialTensionNPerM * 1e3).toPrecision(3)} mN/m).`;
        if (ca >= tJet) {
          flags.push(makeFlag("droplet_jetting", { target, at, value: ca, threshold: tJet, message: `${base} That is in the jetting range: the dispersed phase forms a long jet that breaks far downstream into droplets of spread sizes. Lower the continuous-phase flow, or raise the interfacial tension (less surfactant).` }));
        } else if (ca >= tSq) {
          const transitional = ca < tDrip ? ` It is close to the squeezing–dripping transition (Ca ≈ ${num(tDrip)}), so droplet size may be sensitive to small flow changes.` : "";
          flags.push(makeFlag("droplet_dripping", { target, at, value: ca, threshold: tDrip, message: `${base} Droplets break off in the dripping regime: shear pulls them off before they fill the channel, and they get smaller as the flow rises.${transitional}` }));
        } else {
          flags.push(makeFlag("droplet_squeezing", { target, at, value: ca, threshold: tSq, message: `${base} Droplets form in the squeezing regime: the dispersed thread fills the channel and is pinched off by the upstream pressure; droplet length is about w·(1 + Q_d/Q_c), set by the flow-rate ratio rather than by Ca.` }));
        }
        continue;
      }
    }
    // Mixing: two incoming streams from disjoint sets of (continuous-phase) inlets.
    let disjoint = false;
    for (let a = 0; a < incoming.length && !disjoint; a++) {
      for (let b = a + 1; b < incoming.length; b++) {
        const ma = segmentMask[incoming[a][0]];
        const mb = segmentMask[incoming[b][0]];
        if (ma && mb && (ma & mb) === 0 && (ma & dispersedBits) === 0 && (mb & dispersedBits) === 0) {
          disjoint = true;
          break;
        }
      }
    }
    if (!disjoint) continue;
    // Follow the largest outflow to an outlet, adding up L/(Pe·w), the share of the mixing length each piece provides.
    let progress = 0;
    let lengthM = 0;
    let cur = i;
    const seen = new Set<number>();
    while (!seen.has(cur)) {
      seen.add(cur);
      const outs = graph.out[cur];
      if (outs.length === 0) break;
      let best = outs[0];
      for (const o of outs) if (Math.abs(h.segments[o[0]].flowM3PerS) > Math.abs(h.segments[best[0]].flowM3PerS)) best = o;
      const seg = h.segments[best[0]];
      progress += network.segments[best[0]].lengthM / seg.mixingLengthM;
      lengthM += network.segments[best[0]].lengthM;
      cur = best[1];
    }
    if (progress < tMix) {
      const firstOut = graph.out[i][0];
      const needM = firstOut ? h.segments[firstOut[0]].mixingLengthM : 0;
      flags.push(makeFlag("mixing_incomplete", {
        target: { kind: "node", id: node.id },
        at: nodeAt(i),
        value: progress,
        threshold: tMix,
        message: `Streams meet at node ${node.id}, but the ${(lengthM * 1e3).toPrecision(3)} mm of channel to the outlet gives only ${(progress * 100).toPrecision(3)} % of the diffusive mixing length (≈ Pe·w, ${(needM * 1e3).toPrecision(3)} mm in the first segment), so the streams leave largely unmixed. Lengthen or narrow the channel, slow the flow, or add a passive mixer.`,
      }));
    }
  }
  return flags;
}
