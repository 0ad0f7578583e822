import type { CustomLayerInterface, CustomRenderMethodInput, Map as MapLibreMap } from 'maplibre-gl';
import type { RasterBox, RasterImage } from './raster';
import { lonLatToMercator } from '../core/webMercator';

/**
 * Every station symbol at once, for the zooms at which every symbol is shown (no thinning, no
 * collision): a MapLibre custom layer, drawn on the map's GPU context through MapLibre's public
 * custom-layer interface.
 *
 * Why not a symbol layer there too: a symbol layer lays out every icon in the map's worker
 * (quads, collision boxes) and places every one of them on the main thread each time the
 * placement runs. With 10^5 stations in view that was most of a first render; here the symbols
 * are one vertex buffer, built once per `setSymbols`.
 *
 * Drawing: each symbol is drawn in the plane of the map around its station, its image turned
 * clockwise from north by its rotation (map-aligned, so true to north at any bearing and
 * pitch), sized in CSS px at the map's centre and foreshortened with distance like anything on
 * the map, as MapLibre draws map-pitched icons that have an `icon-offset` (its symbol vertex
 * shader applies its perspective ratio only to icons without one; the overlay's symbol layer
 * has one, so the two layers agree). Images are rasterised at the map's pixel ratio (rounded
 * up) so they stay sharp, and blended with premultiplied alpha as MapLibre blends custom layers.
 * Positions are stored relative to zoom-10 tiles and drawn with each tile's matrix, so float32
 * keeps them to millimetres at any zoom.
 *
 * Cost. On a software rasteriser (headless Chromium without a GPU) the pixels filled are most of
 * the cost, so (1) an image is drawn as a few rectangles that follow its painted rows (a strike
 * line and its dip mark, not the box around both), and (2) the symbols are drawn into a texture
 * of the canvas's size that each frame shows: the texture is drawn again only when the view,
 * the canvas or the symbols changed, since a map redraws for many other reasons (a tile of
 * another layer arrives, a hover ring changes). Quads are plain indexed triangles, not
 * instances: the software rasteriser draws instanced quads one instance at a time.
 *
 * Web Mercator without terrain only: {@link isSymbolGlLayerSupported} says when; the overlay
 * keeps its symbol layer for the other cases. Each group of symbols is drawn in the copy of the
 * world nearest the view's centre, so a map panned across the antimeridian shows them. After a
 * lost WebGL context MapLibre adds its layers again: `onAdd` then builds every GPU resource anew.
 * MapLibre's feature queries do not see the symbols drawn here; the overlay's picker finds them.
 * @example
 * const layer = new SymbolGlLayer('foldlens-symbols-gl', { minZoom: 15, sizeAt: () => 1 });
 * map.addLayer(layer);
 * layer.setSymbols({ lon, lat, image, rotation }, images);
 */
export class SymbolGlLayer implements CustomLayerInterface {
  readonly id: string;
  readonly type = 'custom' as const;
  readonly renderingMode = '2d' as const;
  private readonly options: SymbolGlLayerOptions;
  private map: MapLibreMap | null = null;
  private program: WebGLProgram | null = null;
  private copyProgram: WebGLProgram | null = null;
  private vao: WebGLVertexArrayObject | null = null;
  private vertexBuffer: WebGLBuffer | null = null;
  private indexBuffer: WebGLBuffer | null = null;
  private atlasTexture: WebGLTexture | null = null;
  private framebuffer: WebGLFramebuffer | null = null;
  private cacheTexture: WebGLTexture | null = null;
  private cacheSize: [number, number] = [0, 0];
  /** What the cached texture shows (camera matrix, zoom, canvas size, symbols version); null when it shows nothing. */
  private cacheKey: Float64Array | null = null;
  private uniforms: Record<string, WebGLUniformLocation | null> = {};
  private geometry: Geometry | null = null;
  private uploaded = false;
  private version = 0;
  private drawn = 0;

  constructor(id: string, options: SymbolGlLayerOptions) {
    this.id = id;
    this.options = options;
  }

  /**
   * Replaces the symbols. `images` maps each image code used in `symbols.image` to its image (at
   * the map's pixel ratio) and the box it covers around the station; symbols whose code has no
   * image are not drawn.
   */
  setSymbols(symbols: SymbolInstances, images: ReadonlyMap<number, SymbolImage>): void {
    this.geometry = buildGeometry(symbols, images);
    this.uploaded = false;
    this.version++;
    this.map?.triggerRepaint();
  }

  /** How many symbols the last drawing of the layer held (0 while it draws nothing). */
  get drawnSymbols(): number {
    return this.cacheKey ? this.drawn : 0;
  }

  onAdd(map: MapLibreMap, gl: WebGL2RenderingContext): void {
    this.map = map;
    const program = linkProgram(gl, VERTEX_SHADER, FRAGMENT_SHADER);
    this.program = program;
    for (const name of ['u_matrix', 'u_scale', 'u_atlas']) this.uniforms[name] = gl.getUniformLocation(program, name);
    this.copyProgram = linkProgram(gl, COPY_VERTEX_SHADER, COPY_FRAGMENT_SHADER);
    this.uniforms.u_image = gl.getUniformLocation(this.copyProgram, 'u_image');
    this.vao = gl.createVertexArray();
    gl.bindVertexArray(this.vao);
    this.vertexBuffer = gl.createBuffer();
    gl.bindBuffer(gl.ARRAY_BUFFER, this.vertexBuffer);
    const attribute = (name: string, size: number, type: number, normalized: boolean, offset: number) => {
      const at = gl.getAttribLocation(program, name);
      gl.enableVertexAttribArray(at);
      gl.vertexAttribPointer(at, size, type, normalized, VERTEX_BYTES, offset);
    };
    attribute('a_anchor', 2, gl.FLOAT, false, 0);
    attribute('a_turn', 2, gl.SHORT, true, 8);
    attribute('a_corner', 2, gl.SHORT, false, 12);
    attribute('a_uv', 2, gl.UNSIGNED_SHORT, true, 16);
    this.indexBuffer = gl.createBuffer();
    gl.bindBuffer(gl.ELEMENT_ARRAY_BUFFER, this.indexBuffer);
    gl.bindVertexArray(null);
    this.atlasTexture = gl.createTexture();
    this.framebuffer = gl.createFramebuffer();
    this.cacheTexture = gl.createTexture();
    this.cacheSize = [0, 0];
    this.cacheKey = null;
    this.uploaded = false;
  }

  onRemove(_map: MapLibreMap, gl: WebGL2RenderingContext): void {
    gl.deleteProgram(this.program);
    gl.deleteProgram(this.copyProgram);
    gl.deleteVertexArray(this.vao);
    gl.deleteBuffer(this.vertexBuffer);
    gl.deleteBuffer(this.indexBuffer);
    gl.deleteTexture(this.atlasTexture);
    gl.deleteFramebuffer(this.framebuffer);
    gl.deleteTexture(this.cacheTexture);
    this.program = null;
    this.map = null;
  }

  /** Draws the symbols into the cached texture when what it shows is out of date. */
  prerender(gl: WebGL2RenderingContext, input: CustomRenderMethodInput): void {
    const map = this.map;
    const geometry = this.geometry;
    if (!map || !this.program || !geometry || geometry.groups.length === 0 || !this.canDraw(input)) {
      this.cacheKey = null;
      return;
    }
    const zoom = map.getZoom();
    const w = gl.drawingBufferWidth;
    const h = gl.drawingBufferHeight;
    const key = new Float64Array(20);
    key.set(input.modelViewProjectionMatrix);
    key.set([zoom, w, h, this.version], 16);
    const cached = this.cacheKey;
    if (cached && key.every((v, i) => v === cached[i])) return;
    if (!this.uploaded) this.upload(gl, geometry);
    if (this.cacheSize[0] !== w || this.cacheSize[1] !== h) {
      gl.bindTexture(gl.TEXTURE_2D, this.cacheTexture);
      gl.texImage2D(gl.TEXTURE_2D, 0, gl.RGBA, w, h, 0, gl.RGBA, gl.UNSIGNED_BYTE, null);
      setSampling(gl, gl.NEAREST);
      this.cacheSize = [w, h];
    }
    gl.bindFramebuffer(gl.FRAMEBUFFER, this.framebuffer);
    gl.framebufferTexture2D(gl.FRAMEBUFFER, gl.COLOR_ATTACHMENT0, gl.TEXTURE_2D, this.cacheTexture, 0);
    gl.viewport(0, 0, w, h);
    for (const cap of [gl.DEPTH_TEST, gl.STENCIL_TEST, gl.CULL_FACE, gl.SCISSOR_TEST]) gl.disable(cap);
    gl.colorMask(true, true, true, true);
    gl.clearColor(0, 0, 0, 0);
    gl.clear(gl.COLOR_BUFFER_BIT);
    // Premultiplied alpha, as MapLibre blends custom layers: the texture then holds premultiplied colour.
    gl.enable(gl.BLEND);
    gl.blendFunc(gl.ONE, gl.ONE_MINUS_SRC_ALPHA);
    this.drawSymbols(gl, input, geometry, zoom);
    this.drawn = geometry.groups.reduce((sum, g) => sum + g.symbolCount, 0);
    gl.bindFramebuffer(gl.FRAMEBUFFER, null);
    this.cacheKey = key;
  }

  /** Shows the cached texture (MapLibre has set up blending for custom layers). */
  render(gl: WebGL2RenderingContext): void {
    if (!this.cacheKey || !this.copyProgram) return;
    gl.useProgram(this.copyProgram);
    gl.bindVertexArray(null);
    gl.activeTexture(gl.TEXTURE0);
    gl.bindTexture(gl.TEXTURE_2D, this.cacheTexture);
    gl.uniform1i(this.uniforms.u_image, 0);
    // Three vertices made in the shader cover the canvas.
    gl.drawArrays(gl.TRIANGLES, 0, 3);
  }

  private canDraw(input: CustomRenderMethodInput): boolean {
    const map = this.map!;
    return input.shaderData.variantName === 'mercator' && isSymbolGlLayerSupported(map) && map.getZoom() >= this.options.minZoom;
  }

  private drawSymbols(gl: WebGL2RenderingContext, input: CustomRenderMethodInput, geometry: Geometry, zoom: number): void {
    gl.useProgram(this.program);
    gl.bindVertexArray(this.vao);
    gl.activeTexture(gl.TEXTURE0);
    gl.bindTexture(gl.TEXTURE_2D, this.atlasTexture);
    gl.uniform1i(this.uniforms.u_atlas, 0);
    // Tile units per CSS px at this zoom (a zoom-10 tile is 512 * 2^(zoom - 10) CSS px wide), times the size factor.
    gl.uniform1f(this.uniforms.u_scale, (EXTENT / (512 * 2 ** (zoom - GROUP_ZOOM))) * this.options.sizeAt(zoom));
    // Each group is drawn in the copy of the world nearest the view's centre, so symbols follow
    // a map panned across the antimeridian (the view is far narrower than half the world here).
    const world = 2 ** GROUP_ZOOM;
    const centreX = ((this.map!.getCenter().lng + 180) / 360) * world;
    for (const g of geometry.groups) {
      const wrap = Math.round((centreX - (g.x + 0.5)) / world);
      const m = input.getProjectionData({ tileID: { canonical: { x: g.x, y: g.y, z: GROUP_ZOOM }, wrap } }).mainMatrix;
      gl.uniformMatrix4fv(this.uniforms.u_matrix, false, m instanceof Float32Array ? m : new Float32Array(m));
      gl.drawElements(gl.TRIANGLES, g.indexCount, gl.UNSIGNED_INT, g.indexStart * 4);
    }
    gl.bindVertexArray(null);
  }

  private upload(gl: WebGL2RenderingContext, geometry: Geometry): void {
    gl.bindVertexArray(this.vao);
    gl.bindBuffer(gl.ARRAY_BUFFER, this.vertexBuffer);
    gl.bufferData(gl.ARRAY_BUFFER, geometry.vertices, gl.STATIC_DRAW);
    gl.bindBuffer(gl.ELEMENT_ARRAY_BUFFER, this.indexBuffer);
    gl.bufferData(gl.ELEMENT_ARRAY_BUFFER, geometry.indices, gl.STATIC_DRAW);
    gl.bindVertexArray(null);
    const atlas = geometry.atlas;
    gl.bindTexture(gl.TEXTURE_2D, this.atlasTexture);
    gl.pixelStorei(gl.UNPACK_FLIP_Y_WEBGL, false);
    gl.pixelStorei(gl.UNPACK_PREMULTIPLY_ALPHA_WEBGL, false);
    gl.pixelStorei(gl.UNPACK_ALIGNMENT, 4);
    gl.texImage2D(gl.TEXTURE_2D, 0, gl.RGBA, atlas.width, atlas.height, 0, gl.RGBA, gl.UNSIGNED_BYTE, atlas.data);
    setSampling(gl, gl.LINEAR);
    this.uploaded = true;
  }
}

/** Options of {@link SymbolGlLayer}. */
export interface SymbolGlLayerOptions {
  /** Below this zoom the layer draws nothing. */
  readonly minZoom: number;
  /** Size factor of the symbols at a (fractional) zoom; 1 draws images at their CSS size. */
  readonly sizeAt: (zoom: number) => number;
}

/** The symbols to draw, as parallel arrays. */
export interface SymbolInstances {
  readonly lon: ArrayLike<number>;
  readonly lat: ArrayLike<number>;
  /** Image code of each symbol (a key of the images map). */
  readonly image: ArrayLike<number>;
  /** Clockwise turn from north, degrees. */
  readonly rotation: ArrayLike<number>;
}

/** One image: its pixels and the box it covers around the station (CSS px, y up). */
export interface SymbolImage {
  readonly image: RasterImage;
  readonly box: RasterBox;
}

/**
 * Whether {@link SymbolGlLayer} can draw on this map now: flat Web Mercator without terrain.
 * @example if (!isSymbolGlLayerSupported(map)) map.setLayerZoomRange('foldlens-symbols', 0, 24);
 */
export function isSymbolGlLayerSupported(map: MapLibreMap): boolean {
  const projection = map.getProjection?.()?.type ?? 'mercator';
  return !map.getTerrain() && projection === 'mercator';
}

/** A rectangle of an image: corners in CSS px around the station (y up), texture rows and columns in the atlas. */
export interface ImageRect {
  readonly left: number;
  readonly bottom: number;
  readonly right: number;
  readonly top: number;
  /** Atlas texels: first column, first row (top), one past the last column and row. */
  readonly col0: number;
  readonly row0: number;
  readonly col1: number;
  readonly row1: number;
}

/**
 * Splits an image into rectangles of whole rows that together hold every painted pixel, so
 * that the pixels a GPU fills (the rectangles' area, plus `quadCost` per rectangle for its
 * corners) are fewest: rows are merged into one rectangle while that costs less than starting
 * a new one. A strike line with its dip mark becomes the line's rows at full width and the
 * mark's rows at the mark's width.
 * @example imageRects(image, box).length // 2 for an inclined bedding symbol
 */
export function imageRects(image: RasterImage, box: RasterBox, quadCost = QUAD_COST_PX): ImageRect[] {
  const { width, height, data, pixelRatio } = image;
  const spans: Array<[number, number] | null> = [];
  for (let row = 0; row < height; row++) {
    let a = width;
    let b = -1;
    for (let col = 0; col < width; col++) {
      if (data[(row * width + col) * 4 + 3] > 0) {
        a = Math.min(a, col);
        b = col;
      }
    }
    spans.push(b < 0 ? null : [a, b + 1]);
  }
  const bands: Array<{ row0: number; row1: number; col0: number; col1: number }> = [];
  for (let row = 0; row < height; row++) {
    const span = spans[row];
    if (!span) continue;
    const last = bands[bands.length - 1];
    if (last && last.row1 === row) {
      const col0 = Math.min(last.col0, span[0]);
      const col1 = Math.max(last.col1, span[1]);
      const merged = (last.row1 + 1 - last.row0) * (col1 - col0);
      const apart = (last.row1 - last.row0) * (last.col1 - last.col0) + (span[1] - span[0]) + quadCost * pixelRatio * pixelRatio;
      if (merged <= apart) {
        Object.assign(last, { row1: row + 1, col0, col1 });
        continue;
      }
    }
    bands.push({ row0: row, row1: row + 1, col0: span[0], col1: span[1] });
  }
  return bands.map((b) => ({
    left: box.left + b.col0 / pixelRatio,
    right: box.left + b.col1 / pixelRatio,
    top: box.top - b.row0 / pixelRatio,
    bottom: box.top - b.row1 / pixelRatio,
    col0: b.col0,
    row0: b.row0,
    col1: b.col1,
    row1: b.row1,
  }));
}

// ---------------------------------------------------------------------------------------------

/** Tile coordinates of MapLibre: a tile is EXTENT units wide. */
const EXTENT = 8192;
/** Zoom of the tiles symbols are grouped by. */
const GROUP_ZOOM = 10;
/** Bytes per vertex: anchor (2 float32), turn cosine and sine (2 int16), corner in 1/16 CSS px (2 int16), atlas position (2 uint16). */
const VERTEX_BYTES = 20;
/** Corners are stored in sixteenths of a CSS px. */
const CORNER_SCALE = 16;
/** A rectangle's corners cost about as much as filling this many CSS px (measured on SwiftShader, roughly). */
const QUAD_COST_PX = 64;
const ATLAS_WIDTH = 512;

interface SymbolGroup {
  readonly x: number;
  readonly y: number;
  readonly indexStart: number;
  indexCount: number;
  symbolCount: number;
}

interface Geometry {
  readonly vertices: ArrayBuffer;
  readonly indices: Uint32Array;
  readonly groups: SymbolGroup[];
  readonly atlas: { readonly width: number; readonly height: number; readonly data: Uint8Array };
}

function setSampling(gl: WebGL2RenderingContext, filter: number): void {
  gl.texParameteri(gl.TEXTURE_2D, gl.TEXTURE_MIN_FILTER, filter);
  gl.texParameteri(gl.TEXTURE_2D, gl.TEXTURE_MAG_FILTER, filter);
  gl.texParameteri(gl.TEXTURE_2D, gl.TEXTURE_WRAP_S, gl.CLAMP_TO_EDGE);
  gl.texParameteri(gl.TEXTURE_2D, gl.TEXTURE_WRAP_T, gl.CLAMP_TO_EDGE);
}

/** Atlas, rectangles and the vertex and index buffers of the symbols, grouped by zoom-10 tile. */
function buildGeometry(symbols: SymbolInstances, images: ReadonlyMap<number, SymbolImage>): Geometry {
  const { atlas, rects } = packAtlas(images);
  const n = symbols.lon.length;
  const world = 2 ** GROUP_ZOOM;
  const tx = new Float64Array(n);
  const ty = new Float64Array(n);
  const byGroup = new Map<number, number[]>();
  let quads = 0;
  for (let i = 0; i < n; i++) {
    const r = rects.get(symbols.image[i]);
    if (!r) continue; // no image for this code: nothing to draw
    const [x, y] = lonLatToMercator(symbols.lon[i], symbols.lat[i]);
    tx[i] = x * world;
    ty[i] = y * world;
    const key = Math.floor(tx[i]) * world + Math.floor(ty[i]);
    const members = byGroup.get(key);
    if (members) members.push(i);
    else byGroup.set(key, [i]);
    quads += r.length;
  }
  const buffer = new ArrayBuffer(quads * 4 * VERTEX_BYTES);
  const f32 = new Float32Array(buffer);
  const i16 = new Int16Array(buffer);
  const u16 = new Uint16Array(buffer);
  const indices = new Uint32Array(quads * 6);
  const groups: SymbolGroup[] = [];
  let q = 0;
  const uvScaleX = 65535 / atlas.width;
  const uvScaleY = 65535 / atlas.height;
  for (const members of byGroup.values()) {
    const gx = Math.floor(tx[members[0]]);
    const gy = Math.floor(ty[members[0]]);
    const group: SymbolGroup = { x: gx, y: gy, indexStart: q * 6, indexCount: 0, symbolCount: members.length };
    for (const i of members) {
      const ax = (tx[i] - gx) * EXTENT;
      const ay = (ty[i] - gy) * EXTENT;
      // The turn as cosine and sine (16-bit, normalised), so no vertex computes them.
      const turn = (symbols.rotation[i] * Math.PI) / 180;
      const cos = Math.round(Math.cos(turn) * 32767);
      const sin = Math.round(Math.sin(turn) * 32767);
      for (const rect of rects.get(symbols.image[i])!) {
        for (let corner = 0; corner < 4; corner++) {
          const right = corner & 1;
          const top = corner >> 1;
          const v = q * 4 + corner;
          f32[v * 5] = ax;
          f32[v * 5 + 1] = ay;
          i16[v * 10 + 4] = cos;
          i16[v * 10 + 5] = sin;
          i16[v * 10 + 6] = Math.round((right ? rect.right : rect.left) * CORNER_SCALE);
          i16[v * 10 + 7] = Math.round((top ? rect.top : rect.bottom) * CORNER_SCALE);
          u16[v * 10 + 8] = Math.round((right ? rect.col1 : rect.col0) * uvScaleX);
          u16[v * 10 + 9] = Math.round((top ? rect.row0 : rect.row1) * uvScaleY);
        }
        // Two triangles: corners 0 1 2 and 2 1 3 (corner bit 0: right, bit 1: top).
        const v = q * 4;
        const o = q * 6;
        indices[o] = v;
        indices[o + 1] = v + 1;
        indices[o + 2] = v + 2;
        indices[o + 3] = v + 2;
        indices[o + 4] = v + 1;
        indices[o + 5] = v + 3;
        q++;
        group.indexCount += 6;
      }
    }
    groups.push(group);
  }
  return { vertices: buffer, indices, groups, atlas };
}

/**
 * Shelf packing of the images into one texture, premultiplied, with a texel of space around
 * each; returns each image's rectangles with their atlas texels.
 */
function packAtlas(images: ReadonlyMap<number, SymbolImage>): {
  atlas: { width: number; height: number; data: Uint8Array };
  rects: Map<number, ImageRect[]>;
} {
  const pad = 1;
  const placed = new Map<number, { x: number; y: number }>();
  let x = pad;
  let y = pad;
  let shelf = 0;
  for (const [code, { image }] of images) {
    if (image.width + 2 * pad > ATLAS_WIDTH) throw new RangeError(`SymbolGlLayer: an image ${image.width} px wide does not fit the ${ATLAS_WIDTH} px atlas`);
    if (x + image.width + pad > ATLAS_WIDTH) {
      x = pad;
      y += shelf + pad;
      shelf = 0;
    }
    placed.set(code, { x, y });
    x += image.width + pad;
    shelf = Math.max(shelf, image.height);
  }
  const width = ATLAS_WIDTH;
  const height = Math.max(1, y + shelf + pad);
  const data = new Uint8Array(width * height * 4);
  const rects = new Map<number, ImageRect[]>();
  for (const [code, { image, box }] of images) {
    const { x: ox, y: oy } = placed.get(code)!;
    for (let row = 0; row < image.height; row++) {
      for (let col = 0; col < image.width; col++) {
        const s = (row * image.width + col) * 4;
        const d = ((oy + row) * width + ox + col) * 4;
        const a = image.data[s + 3] / 255;
        data[d] = image.data[s] * a;
        data[d + 1] = image.data[s + 1] * a;
        data[d + 2] = image.data[s + 2] * a;
        data[d + 3] = image.data[s + 3];
      }
    }
    rects.set(
      code,
      imageRects(image, box).map((r) => ({ ...r, col0: r.col0 + ox, col1: r.col1 + ox, row0: r.row0 + oy, row1: r.row1 + oy })),
    );
  }
  return { atlas: { width, height, data }, rects };
}

function compile(gl: WebGL2RenderingContext, type: number, source: string): WebGLShader {
  const shader = gl.createShader(type)!;
  gl.shaderSource(shader, source);
  gl.compileShader(shader);
  if (!gl.getShaderParameter(shader, gl.COMPILE_STATUS)) throw new Error(`SymbolGlLayer shader: ${gl.getShaderInfoLog(shader)}`);
  return shader;
}

function linkProgram(gl: WebGL2RenderingContext, vertex: string, fragment: string): WebGLProgram {
  const program = gl.createProgram()!;
  const vs = compile(gl, gl.VERTEX_SHADER, vertex);
  const fs = compile(gl, gl.FRAGMENT_SHADER, fragment);
  gl.attachShader(program, vs);
  gl.attachShader(program, fs);
  gl.linkProgram(program);
  gl.deleteShader(vs);
  gl.deleteShader(fs);
  if (!gl.getProgramParameter(program, gl.LINK_STATUS)) throw new Error(`SymbolGlLayer program: ${gl.getProgramInfoLog(program)}`);
  return program;
}

const VERTEX_SHADER = `#version 300 es
precision highp float;
uniform mat4 u_matrix;
uniform float u_scale;
in vec2 a_anchor;
in vec2 a_turn;   // cosine and sine of the turn clockwise from north
in vec2 a_corner; // CSS px times ${CORNER_SCALE}, x east, y north, before the turn
in vec2 a_uv;
out vec2 v_uv;
void main() {
  vec2 p = a_corner / ${CORNER_SCALE}.0;
  vec2 turned = vec2(p.x * a_turn.x + p.y * a_turn.y, p.y * a_turn.x - p.x * a_turn.y);
  // Tile y grows southwards.
  vec2 offset = turned * vec2(1.0, -1.0) * u_scale;
  gl_Position = u_matrix * vec4(a_anchor + offset, 0.0, 1.0);
  v_uv = a_uv;
}`;

const FRAGMENT_SHADER = `#version 300 es
precision mediump float;
uniform sampler2D u_atlas;
in vec2 v_uv;
out vec4 color;
void main() {
  color = texture(u_atlas, v_uv);
}`;

/** A triangle that covers clip space; texture coordinates follow the canvas (GL's row 0 is the bottom one). */
const COPY_VERTEX_SHADER = `#version 300 es
out vec2 v_uv;
void main() {
  vec2 p = vec2(float((gl_VertexID & 1) << 2) - 1.0, float((gl_VertexID & 2) << 1) - 1.0);
  v_uv = p * 0.5 + 0.5;
  gl_Position = vec4(p, 0.0, 1.0);
}`;

const COPY_FRAGMENT_SHADER = `#version 300 es
precision mediump float;
uniform sampler2D u_image;
in vec2 v_uv;
out vec4 color;
void main() {
  color = texture(u_image, v_uv);
}`;
