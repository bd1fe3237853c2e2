/** Text → document → scene → chart: the understanding half of the pipeline, shared by every command. */
import { classifyChart } from '../classify/classify-chart.js';
import type { Chart } from '../classify/chart.js';
import { buildScene, type SceneOptions } from '../read/build-scene.js';
import { parseXml, type ReadLimits } from '../read/parse-xml.js';
import type { Scene } from '../read/scene.js';
import type { XmlDocument } from '../read/xml-tree.js';

export interface Analysis {
  doc: XmlDocument;
  scene: Scene;
  chart: Chart;
}

export interface AnalyzeOptions {
  file?: string;
  limits?: Partial<ReadLimits>;
  scene?: SceneOptions;
}

export function analyzeSvg(text: string, options: AnalyzeOptions = {}): Analysis {
  const doc = parseXml(text, { file: options.file, limits: options.limits });
  const scene = buildScene(doc, options.scene);
  const chart = classifyChart(scene);
  return { doc, scene, chart };
}
