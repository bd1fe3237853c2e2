/**
 * truth.3d-projection: a pie drawn tilted or extruded, or bars drawn with
 * depth. Tilting a pie changes the angles and areas the reader compares;
 * extrusion adds side faces that carry no value.
 */
import { elementsOf, r4, type Rule } from '../rule.js';
import { fmt, percent, times } from '../format-number.js';
import { wedgeName } from '../wedge-name.js';

export const threeDProjection: Rule = {
  id: 'truth.3d-projection',
  family: 'truth',
  severity: 'error',
  rationale:
    'A tilted pie shows wedges at the front and back larger than the same wedges at the sides, and side walls add area to the front wedges; depth on bars adds faces that carry no value and moves the bar tops away from the axis.',
  source:
    'Kosara & Skau, Judgment Error in Pie Chart Variations (EuroVis 2016 short papers); Schonlau & Peters, RAND WR-618 (2008): a gratuitous third dimension hurt accuracy for pies; Zacks et al., J. Exp. Psych.: Applied 4(2) (1998): depth cues lowered the accuracy of bar readings',
  thresholds: {
    /** Apparent/true share ratios of pie wedges inside [ratioLow, ratioHigh] pass (Tufte's lie-factor band). */
    ratioLow: 0.95,
    ratioHigh: 1.05,
    /** Bars: extrusion faces above this share of the bars' area are reported. */
    minExtrusionShare: 0.02,
  },
  fix: 'flatten: draw the pie as a flat circle at its true angles (the bars without their side and top faces)',
  check({ chart, measures, thresholds }) {
    const { pie, bars } = measures.projection;
    if (pie && pie.wedges.length > 0) {
      const dev = (r: number) => (r > 0 && Number.isFinite(r) ? Math.abs(Math.log(r)) : Infinity);
      const outside = (r: number) => !(r >= thresholds.ratioLow && r <= thresholds.ratioHigh);
      if (!outside(pie.worstRatio) && !outside(pie.worstAngleRatio)) return [];
      const byArea = dev(pie.worstRatio) >= dev(pie.worstAngleRatio);
      const worst = byArea
        ? pie.wedges.reduce((a, b) => (dev(b.ratio) > dev(a.ratio) ? b : a))
        : pie.wedges.reduce((a, b) => (dev(b.angleRatio) > dev(a.angleRatio) ? b : a));
      const w = chart.pie?.wedges.find((x) => x.item === worst.item);
      const wn = w ? wedgeName(chart, w) : null;
      const name = wn ? `"${wn}"` : 'one wedge';
      const how = [pie.tilt !== null && pie.tilt > 0 ? `tilted ${fmt((pie.tilt * 180) / Math.PI, 2)}°` : null, pie.walls > 0 ? 'extruded' : null]
        .filter(Boolean)
        .join(' and ');
      const shown = byArea ? worst.apparentShare : worst.drawnAngleShare;
      const cue = byArea ? 'of the visible area' : 'of the drawn angle';
      const message =
        `This pie is drawn ${how || 'in 3D'}: ${name} is ${percent(worst.trueShare)} of the data but takes ${percent(shown)} ${cue} ` +
        `(${times(shown / worst.trueShare)} its share). Across wedges, visible areas are off by up to ${times(pie.worstRatio)} and drawn angles by up to ${times(pie.worstAngleRatio)}.`;
      return [
        {
          message,
          elements: elementsOf(chart, pie.wedges.map((x) => x.item)),
          measures: {
            tiltDegrees: pie.tilt === null ? null : r4((pie.tilt * 180) / Math.PI),
            walls: pie.walls,
            worstRatio: r4(pie.worstRatio),
            worstAngleRatio: r4(pie.worstAngleRatio),
            wedges: pie.wedges.map((x) => ({
              trueShare: r4(x.trueShare),
              apparentShare: r4(x.apparentShare),
              drawnAngleShare: r4(x.drawnAngleShare),
            })),
          },
        },
      ];
    }
    if (bars && bars.share > thresholds.minExtrusionShare) {
      return [
        {
          severity: 'warning',
          message:
            `Bars are drawn with depth: ${percent(bars.share, 2)} of their area is side and top faces that carry no value, ` +
            'and a bar top read against the axis depends on which face the eye picks.',
          elements: elementsOf(chart, [...bars.bars, ...bars.faces]),
          measures: { extrusionShare: r4(bars.share), faces: bars.faces.length, bars: bars.bars.length },
        },
      ];
    }
    return [];
  },
};
