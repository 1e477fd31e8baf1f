/**
 * Fabrication rules from the process profile: minimum width, spacing between
 * neighbouring channels, aspect-ratio limits (roof sag, too deep, tall thin
 * walls), cross-section profile, and margins to the die outline.
 */
import type { ChannelNetwork, NetworkSegment } from "../network/types";
import type { Conditions } from "../analysis/conditions";
import type { Flag } from "../hydraulics/types";
import { makeFlag, thresholdFor } from "./registry";
import type { MaskType, ProcessProfile } from "./processes";
import { candidatePairs, pointInPolygon, polylineDistance, polylineToRingDistance, type Pt } from "./geometry";
import { mm, num, um } from "./format";

function segPath(network: ChannelNetwork, seg: NetworkSegment, nodeXY: Map<string, Pt>): Pt[] {
  if (seg.path && seg.path.length >= 2) return seg.path;
  return [nodeXY.get(seg.from) ?? [0, 0], nodeXY.get(seg.to) ?? [0, 0]];
}

const minWidth = (s: NetworkSegment) => s.minWidthM ?? Math.min(s.widthM, s.endWidthM > 0 ? s.endWidthM : s.widthM, ...(s.widthProfile?.widthM ?? []));
const maxWidth = (s: NetworkSegment) => s.maxWidthM ?? Math.max(s.widthM, s.endWidthM, ...(s.widthProfile?.widthM ?? []));
const mid = (p: Pt[]) => ({ xM: p[Math.floor(p.length / 2)][0], yM: p[Math.floor(p.length / 2)][1] });

/** Fabrication flags for every segment, neighbouring pair and port against the process profile. */
export function evaluateFabricationFlags(network: ChannelNetwork, conditions: Conditions, process: ProcessProfile): Flag[] {
  const flags: Flag[] = [];
  const mask: MaskType = conditions.mask ?? process.defaultMask;
  const tWidth = thresholdFor("fab_min_width", conditions, process.minFeatureM[mask]);
  const tSpace = thresholdFor("fab_min_spacing", conditions, process.minSpacingM[mask]);
  const tRoof = process.minAspect === null ? null : thresholdFor("fab_roof_collapse", conditions, process.minAspect);
  const tDeep = process.maxAspect === null ? null : thresholdFor("fab_aspect_max", conditions, process.maxAspect);
  const tWall = process.maxWallAspect === null ? null : thresholdFor("fab_tall_wall", conditions, process.maxWallAspect);
  const tEdge = thresholdFor("fab_edge_margin", conditions, process.edgeMarginM);
  const nodeXY = new Map<string, Pt>(network.nodes.map((n) => [n.id, [n.xM, n.yM]]));
  const paths = network.segments.map((s) => segPath(network, s, nodeXY));
  const maskWords = process.id.startsWith("thermoplastic_milling") ? "the tool" : `a ${mask} mask`;

  network.segments.forEach((seg, k) => {
    const target = { kind: "segment" as const, id: seg.id };
    const at = mid(paths[k]);
    const wMin = minWidth(seg);
    const wMax = maxWidth(seg);
    // An isotropic etch widens the mask line by twice the depth (Iliescu et al. 2012), so the mask line is w − 2d.
    const maskLine = seg.section === "isotropic_etch" ? wMin - 2 * seg.depthM : wMin;
    if (maskLine < tWidth) {
      const what = seg.section === "isotropic_etch" ? `needs a mask line of ${um(Math.max(maskLine, 0))} (its ${um(wMin)} top width minus twice the ${um(seg.depthM)} depth)` : `is ${um(wMin)} wide`;
      flags.push(makeFlag("fab_min_width", { target, at, value: maskLine, threshold: tWidth, source: process.sources.minFeature, message: `Segment ${seg.id} ${what}, below the ${um(tWidth)} that ${maskWords} resolves for ${process.label}. It will print wider, ragged or not at all. Widen it, or use a finer mask.` }));
    }
    if (seg.section === "circular") return;
    const depth = seg.depthM;
    if (tRoof !== null && depth / wMax < tRoof) {
      flags.push(makeFlag("fab_roof_collapse", { target, at, value: depth / wMax, threshold: tRoof, source: process.sources.minAspect, message: `Segment ${seg.id} is ${um(wMax)} wide but only ${um(depth)} deep (depth/width ${num(depth / wMax)}). Its roof can sag onto the floor and close the channel, especially under bonding pressure. Add support posts, make it deeper, or split it into narrower channels.` }));
    }
    if (tDeep !== null && depth / wMin > tDeep) {
      const block = process.maxAspectSeverity === "block";
      flags.push(makeFlag("fab_aspect_max", { target, at, severity: process.maxAspectSeverity, value: depth / wMin, threshold: tDeep, source: process.sources.maxAspect, message: `Segment ${seg.id} is ${um(depth)} deep and ${um(wMin)} wide (depth/width ${num(depth / wMin)}), beyond ${num(tDeep)} for ${process.label}. ${block ? "The process cannot make this shape: the etch front stops or widens first. Make it wider or shallower." : "It may not form or release cleanly. Make it wider or shallower."}` }));
    }
    if (seg.section !== process.section && !process.alsoSections.includes(seg.section)) {
      flags.push(makeFlag("fab_profile", { target, at, value: null, threshold: null, source: process.sources.section, message: `Segment ${seg.id} is computed as ${seg.section.replace("_", " ")}, but ${process.label} makes ${process.section.replace("_", " ")} channels. The resistance and shear figures follow the drawn section; set the layer's section to "${process.section}" for figures that match the chip.` }));
    }
  });

  // Neighbouring channels: gap = centreline distance − half widths. Pairs that share a node, or are joined by one
  // segment shorter than their widths, meet at a junction and are not neighbours.
  const incident = new Map<string, number[]>();
  network.segments.forEach((s, k) => {
    for (const n of [s.from, s.to]) {
      const list = incident.get(n);
      if (list) list.push(k);
      else incident.set(n, [k]);
    }
  });
  const related = (i: number, j: number): boolean => {
    const a = network.segments[i];
    const b = network.segments[j];
    const an = [a.from, a.to];
    const bn = [b.from, b.to];
    if (an.some((n) => bn.includes(n))) return true;
    for (const n of an) {
      for (const k of incident.get(n) ?? []) {
        const c = network.segments[k];
        if (c.lengthM < maxWidth(a) + maxWidth(b) && (bn.includes(c.from) || bn.includes(c.to))) return true;
      }
    }
    return false;
  };
  let wallReach = 0;
  let widest = 0;
  for (const s of network.segments) {
    if (tWall !== null) wallReach = Math.max(wallReach, s.depthM / tWall);
    widest = Math.max(widest, maxWidth(s));
  }
  const reach = Math.max(tSpace, wallReach) + widest;
  const boxes = paths.map((p) => ({ minX: Math.min(...p.map((q) => q[0])), minY: Math.min(...p.map((q) => q[1])), maxX: Math.max(...p.map((q) => q[0])), maxY: Math.max(...p.map((q) => q[1])) }));
  // Grid cells about the size of a typical segment (but at least twice the reach): few cells per segment, few segments per cell.
  const sizes = boxes.map((b) => Math.max(b.maxX - b.minX, b.maxY - b.minY)).sort((a, b) => a - b);
  const cell = Math.max(reach * 2, sizes.length ? sizes[Math.floor(sizes.length / 2)] : reach * 2, 1e-9);
  for (const [i, j] of candidatePairs(boxes, reach, cell)) {
    if (related(i, j)) continue;
    const a = network.segments[i];
    const b = network.segments[j];
    const gap = polylineDistance(paths[i], paths[j]) - (maxWidth(a) + maxWidth(b)) / 2;
    const target = { kind: "segment" as const, id: a.id };
    if (gap < tSpace) {
      flags.push(makeFlag("fab_min_spacing", { target, at: mid(paths[i]), value: gap, threshold: tSpace, source: process.sources.minSpacing, message: gap <= 0 ? `Segments ${a.id} and ${b.id} overlap or touch without a junction; they will merge into one channel. Move them apart or join them deliberately.` : `Segments ${a.id} and ${b.id} are only ${um(gap)} apart, below the ${um(tSpace)} the process holds. The wall between them may not form or may tear. Move them apart.` }));
    } else if (tWall !== null) {
      const depth = Math.max(a.depthM, b.depthM);
      if (depth / gap > tWall) {
        flags.push(makeFlag("fab_tall_wall", { target, at: mid(paths[i]), value: depth / gap, threshold: tWall, source: process.sources.maxWallAspect, message: `The wall between segments ${a.id} and ${b.id} is ${um(depth)} tall and ${um(gap)} thick (height/thickness ${num(depth / gap)}, limit ${num(tWall)}). It may lean, bulge or collapse. Move the channels apart or make them shallower.` }));
      }
    }
  }

  // Die outline: margins from channel edges and port rims to the outline, and anything outside it.
  if (network.outline.length > 0) {
    const rings = network.outline.filter((r) => r.length >= 3) as Pt[][];
    const inside = (p: Pt) => rings.some((r) => pointInPolygon(p, r));
    network.segments.forEach((seg, k) => {
      const path = paths[k];
      const target = { kind: "segment" as const, id: seg.id };
      if (!path.every(inside)) {
        flags.push(makeFlag("fab_outside_outline", { target, at: mid(path), value: null, threshold: 0, message: `Segment ${seg.id} runs outside the die outline and would be cut away. Move it inside the die or enlarge the outline.` }));
        return;
      }
      const d = Math.min(...rings.map((r) => polylineToRingDistance(path, r))) - maxWidth(seg) / 2;
      if (d < tEdge) {
        flags.push(makeFlag("fab_edge_margin", { target, at: mid(path), value: d, threshold: tEdge, source: process.sources.edgeMargin, message: `Segment ${seg.id} comes within ${mm(Math.max(d, 0))} of the die edge, less than the ${mm(tEdge)} margin for ${process.label}. Dicing or bonding may open it. Move it inward.` }));
      }
    });
    for (const port of network.ports) {
      const c: Pt = [port.xM, port.yM];
      const target = { kind: "port" as const, id: port.name };
      const at = { xM: port.xM, yM: port.yM };
      if (!inside(c)) {
        flags.push(makeFlag("fab_outside_outline", { target, at, value: null, threshold: 0, message: `Port ${port.name} lies outside the die outline. Move it inside the die.` }));
        continue;
      }
      const d = Math.min(...rings.map((r) => polylineToRingDistance([c], r))) - port.radiusM;
      if (d < tEdge) {
        flags.push(makeFlag("fab_edge_margin", { target, at, value: d, threshold: tEdge, source: process.sources.edgeMargin, message: `Port ${port.name}'s rim is ${mm(Math.max(d, 0))} from the die edge, less than the ${mm(tEdge)} margin; punching or drilling may crack the edge. Move it inward.` }));
      }
    }
  }
  return flags;
}
