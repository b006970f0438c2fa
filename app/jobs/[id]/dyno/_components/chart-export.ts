"use client";

// Exports a drawn chart: the chart's own SVG serialised (with a legend written into it), or the
// same SVG painted onto a canvas for a PNG. Nothing is sent anywhere.

export interface ExportLegendItem {
  label: string;
  colour: string;
  dashed?: boolean;
}

const SVG_NS = "http://www.w3.org/2000/svg";

/** A standalone copy of the chart's SVG with a title and legend above it. */
function standaloneSvg(container: HTMLElement, title: string, legend: ExportLegendItem[]): { text: string; width: number; height: number } {
  const svg = container.querySelector("svg.recharts-surface") as SVGSVGElement | null;
  if (!svg) throw new Error("The chart is not drawn yet.");
  const width = svg.width.baseVal.value || svg.clientWidth;
  const chartHeight = svg.height.baseVal.value || svg.clientHeight;
  const top = 36 + legend.length * 22;
  const height = chartHeight + top;
  const out = document.createElementNS(SVG_NS, "svg");
  out.setAttribute("xmlns", SVG_NS);
  out.setAttribute("width", String(width));
  out.setAttribute("height", String(height));
  out.setAttribute("viewBox", `0 0 ${width} ${height}`);
  out.setAttribute("font-family", "Arial, Helvetica, sans-serif");
  const bg = document.createElementNS(SVG_NS, "rect");
  bg.setAttribute("width", "100%");
  bg.setAttribute("height", "100%");
  bg.setAttribute("fill", "#ffffff");
  out.appendChild(bg);
  const t = document.createElementNS(SVG_NS, "text");
  t.setAttribute("x", "12");
  t.setAttribute("y", "24");
  t.setAttribute("font-size", "18");
  t.setAttribute("font-weight", "bold");
  t.textContent = title;
  out.appendChild(t);
  legend.forEach((item, i) => {
    const y = 46 + i * 22;
    const line = document.createElementNS(SVG_NS, "line");
    line.setAttribute("x1", "12");
    line.setAttribute("x2", "48");
    line.setAttribute("y1", String(y - 5));
    line.setAttribute("y2", String(y - 5));
    line.setAttribute("stroke", item.colour);
    line.setAttribute("stroke-width", "3");
    if (item.dashed) line.setAttribute("stroke-dasharray", "8 5");
    out.appendChild(line);
    const label = document.createElementNS(SVG_NS, "text");
    label.setAttribute("x", "56");
    label.setAttribute("y", String(y));
    label.setAttribute("font-size", "14");
    label.textContent = item.label;
    out.appendChild(label);
  });
  const chart = svg.cloneNode(true) as SVGSVGElement;
  chart.setAttribute("x", "0");
  chart.setAttribute("y", String(top));
  chart.removeAttribute("style");
  out.appendChild(chart);
  return { text: new XMLSerializer().serializeToString(out), width, height };
}

function download(blob: Blob, fileName: string) {
  const url = URL.createObjectURL(blob);
  const a = document.createElement("a");
  a.href = url;
  a.download = fileName;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

export function downloadSvg(container: HTMLElement, title: string, legend: ExportLegendItem[], fileName: string) {
  const { text } = standaloneSvg(container, title, legend);
  download(new Blob([text], { type: "image/svg+xml" }), fileName);
}

/** Paints the standalone SVG on a canvas at twice its size and downloads it as PNG. */
export async function downloadPng(container: HTMLElement, title: string, legend: ExportLegendItem[], fileName: string) {
  const { text, width, height } = standaloneSvg(container, title, legend);
  const img = new Image();
  const loaded = new Promise<void>((resolve, reject) => {
    img.onload = () => resolve();
    img.onerror = () => reject(new Error("The chart could not be painted."));
  });
  img.src = `data:image/svg+xml;charset=utf-8,${encodeURIComponent(text)}`;
  await loaded;
  const scale = 2;
  const canvas = document.createElement("canvas");
  canvas.width = width * scale;
  canvas.height = height * scale;
  const ctx = canvas.getContext("2d");
  if (!ctx) throw new Error("This browser cannot paint a PNG.");
  ctx.scale(scale, scale);
  ctx.drawImage(img, 0, 0, width, height);
  const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, "image/png"));
  if (!blob) throw new Error("The PNG could not be made.");
  download(blob, fileName);
}
