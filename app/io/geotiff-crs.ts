/**
 * A projected GeoTIFF's projection as a proj4 definition, from its GeoKeys (GeoTIFF 1.1, OGC 19-008r4):
 * an EPSG code we know (the table below), or the projection's own parameters (ProjectedCSTypeGeoKey =
 * 32767, user-defined) for the coordinate transformations satellite ocean products use. The longitude and
 * latitude that come out are on the raster's own ellipsoid (no datum shift: metres at most, far below a cell).
 * Anything else is `unknown` with the code or method, so the reader can say which one in one sentence.
 */

export type CrsResult = { proj4: string; name: string } | { unknown: string };

/** GeoKeys as the `geotiff` package hands them out (by name). */
export type GeoKeys = Record<string, number | string | ArrayLike<number> | undefined>;

const USER_DEFINED = 32767;

/**
 * Projected CRSs by EPSG code. Definitions as PROJ's EPSG database gives them (pyproj 3.4.1
 * `CRS.from_epsg(code).to_proj4()`, Debian bookworm), trimmed of +type=crs and +no_defs.
 */
const EPSG_PROJECTED: Record<number, [string, string]> = {
  3031: ['WGS 84 / Antarctic Polar Stereographic', '+proj=stere +lat_0=-90 +lat_ts=-71 +lon_0=0 +x_0=0 +y_0=0 +datum=WGS84 +units=m'],
  3408: ['NSIDC EASE-Grid North', '+proj=laea +lat_0=90 +lon_0=0 +x_0=0 +y_0=0 +R=6371228 +units=m'],
  3409: ['NSIDC EASE-Grid South', '+proj=laea +lat_0=-90 +lon_0=0 +x_0=0 +y_0=0 +R=6371228 +units=m'],
  3411: ['NSIDC Sea Ice Polar Stereographic North', '+proj=stere +lat_0=90 +lat_ts=70 +lon_0=-45 +x_0=0 +y_0=0 +a=6378273 +b=6356889.449 +units=m'],
  3412: ['NSIDC Sea Ice Polar Stereographic South', '+proj=stere +lat_0=-90 +lat_ts=-70 +lon_0=0 +x_0=0 +y_0=0 +a=6378273 +b=6356889.449 +units=m'],
  3413: ['WGS 84 / NSIDC Sea Ice Polar Stereographic North', '+proj=stere +lat_0=90 +lat_ts=70 +lon_0=-45 +x_0=0 +y_0=0 +datum=WGS84 +units=m'],
  3572: ['WGS 84 / North Pole LAEA Alaska', '+proj=laea +lat_0=90 +lon_0=-150 +x_0=0 +y_0=0 +datum=WGS84 +units=m'],
  3575: ['WGS 84 / North Pole LAEA Europe', '+proj=laea +lat_0=90 +lon_0=10 +x_0=0 +y_0=0 +datum=WGS84 +units=m'],
  3857: ['WGS 84 / Pseudo-Mercator', '+proj=merc +a=6378137 +b=6378137 +lat_ts=0 +lon_0=0 +x_0=0 +y_0=0 +k=1 +units=m'],
  3976: ['WGS 84 / NSIDC Sea Ice Polar Stereographic South', '+proj=stere +lat_0=-90 +lat_ts=-70 +lon_0=0 +x_0=0 +y_0=0 +datum=WGS84 +units=m'],
  3995: ['WGS 84 / Arctic Polar Stereographic', '+proj=stere +lat_0=90 +lat_ts=71 +lon_0=0 +x_0=0 +y_0=0 +datum=WGS84 +units=m'],
  3996: ['WGS 84 / IBCAO Polar Stereographic', '+proj=stere +lat_0=90 +lat_ts=75 +lon_0=0 +x_0=0 +y_0=0 +datum=WGS84 +units=m'],
  5041: ['WGS 84 / UPS North (E,N)', '+proj=stere +lat_0=90 +lon_0=0 +k=0.994 +x_0=2000000 +y_0=2000000 +datum=WGS84 +units=m'],
  5042: ['WGS 84 / UPS South (E,N)', '+proj=stere +lat_0=-90 +lon_0=0 +k=0.994 +x_0=2000000 +y_0=2000000 +datum=WGS84 +units=m'],
  6931: ['WGS 84 / NSIDC EASE-Grid 2.0 North', '+proj=laea +lat_0=90 +lon_0=0 +x_0=0 +y_0=0 +datum=WGS84 +units=m'],
  6932: ['WGS 84 / NSIDC EASE-Grid 2.0 South', '+proj=laea +lat_0=-90 +lon_0=0 +x_0=0 +y_0=0 +datum=WGS84 +units=m'],
};

/** Ellipsoids of geographic CRS codes (EPSG): WGS 84 and the GRS 1980 based ones. */
const GEOGRAPHIC_ELLIPSOID: Record<number, string> = {
  4326: '+datum=WGS84',
  4269: '+ellps=GRS80', // NAD83
  4258: '+ellps=GRS80', // ETRS89
  4283: '+ellps=GRS80', // GDA94
  4617: '+ellps=GRS80', // NAD83(CSRS)
  7844: '+ellps=GRS80', // GDA2020
};
const ELLIPSOID: Record<number, string> = { 7030: '+datum=WGS84', 7019: '+ellps=GRS80', 7008: '+ellps=clrk66' };

function num(keys: GeoKeys, name: string): number | undefined {
  const v = keys[name];
  return typeof v === 'number' && Number.isFinite(v) ? v : undefined;
}

function first(keys: GeoKeys, ...names: string[]): number | undefined {
  for (const n of names) {
    const v = num(keys, n);
    if (v !== undefined) return v;
  }
  return undefined;
}

/** UTM zones on WGS 84: EPSG 32601–32660 (north) and 32701–32760 (south). */
function utm(code: number): [string, string] | undefined {
  const zone = code % 100;
  if (zone < 1 || zone > 60) return undefined;
  if (code - zone === 32600) return [`WGS 84 / UTM zone ${zone}N`, `+proj=utm +zone=${zone} +datum=WGS84 +units=m`];
  if (code - zone === 32700) return [`WGS 84 / UTM zone ${zone}S`, `+proj=utm +zone=${zone} +south +datum=WGS84 +units=m`];
  return undefined;
}

/** The ellipsoid part of a definition from the geographic GeoKeys, or undefined when not stated or unknown. */
function ellipsoidOf(keys: GeoKeys): string | undefined {
  const a = num(keys, 'GeogSemiMajorAxisGeoKey');
  const rf = num(keys, 'GeogInvFlatteningGeoKey');
  const b = num(keys, 'GeogSemiMinorAxisGeoKey');
  const geographic = num(keys, 'GeographicTypeGeoKey');
  if (geographic !== undefined && geographic !== USER_DEFINED && GEOGRAPHIC_ELLIPSOID[geographic]) return GEOGRAPHIC_ELLIPSOID[geographic];
  if (a !== undefined && rf !== undefined) return rf === 0 ? `+R=${a}` : `+a=${a} +rf=${rf}`;
  if (a !== undefined && b !== undefined) return `+a=${a} +b=${b}`;
  const ellipsoid = num(keys, 'GeogEllipsoidGeoKey');
  if (ellipsoid !== undefined && ELLIPSOID[ellipsoid]) return ELLIPSOID[ellipsoid];
  return undefined;
}

/** Coordinate transformation codes (GeoTIFF CT_*) and how their GeoKeys become proj4 parameters. */
function userDefined(keys: GeoKeys): CrsResult {
  const method = num(keys, 'ProjCoordTransGeoKey');
  const ellps = ellipsoidOf(keys);
  if (method === undefined) return { unknown: 'a user-defined projection without ProjCoordTransGeoKey' };
  if (!ellps) return { unknown: `a user-defined projection (coordinate transformation ${method}) on an ellipsoid it does not state` };
  const fe = first(keys, 'ProjFalseEastingGeoKey', 'ProjFalseOriginEastingGeoKey', 'ProjCenterEastingGeoKey') ?? 0;
  const fn = first(keys, 'ProjFalseNorthingGeoKey', 'ProjFalseOriginNorthingGeoKey', 'ProjCenterNorthingGeoKey') ?? 0;
  const lon0 = first(keys, 'ProjNatOriginLongGeoKey', 'ProjFalseOriginLongGeoKey', 'ProjCenterLongGeoKey', 'ProjStraightVertPoleLongGeoKey') ?? 0;
  const lat0 = first(keys, 'ProjNatOriginLatGeoKey', 'ProjFalseOriginLatGeoKey', 'ProjCenterLatGeoKey') ?? 0;
  const k = first(keys, 'ProjScaleAtNatOriginGeoKey', 'ProjScaleAtCenterGeoKey') ?? 1;
  const sp1 = num(keys, 'ProjStdParallel1GeoKey');
  const sp2 = num(keys, 'ProjStdParallel2GeoKey');
  const tail = `+x_0=${fe} +y_0=${fn} ${ellps} +units=m`;
  switch (method) {
    case 1: // CT_TransverseMercator
      return { name: 'Transverse Mercator', proj4: `+proj=tmerc +lat_0=${lat0} +lon_0=${lon0} +k=${k} ${tail}` };
    case 7: // CT_Mercator
      return { name: 'Mercator', proj4: sp1 !== undefined ? `+proj=merc +lat_ts=${sp1} +lon_0=${lon0} ${tail}` : `+proj=merc +lon_0=${lon0} +k=${k} ${tail}` };
    case 8: // CT_LambertConfConic_2SP
      return { name: 'Lambert conformal conic (2 standard parallels)', proj4: `+proj=lcc +lat_1=${sp1 ?? lat0} +lat_2=${sp2 ?? sp1 ?? lat0} +lat_0=${lat0} +lon_0=${lon0} ${tail}` };
    case 9: // CT_LambertConfConic_1SP
      return { name: 'Lambert conformal conic (1 standard parallel)', proj4: `+proj=lcc +lat_1=${lat0} +lat_0=${lat0} +lon_0=${lon0} +k_0=${k} ${tail}` };
    case 10: // CT_LambertAzimEqualArea
      return { name: 'Lambert azimuthal equal-area', proj4: `+proj=laea +lat_0=${lat0} +lon_0=${lon0} ${tail}` };
    case 11: // CT_AlbersEqualArea
      return { name: 'Albers equal-area', proj4: `+proj=aea +lat_1=${sp1 ?? lat0} +lat_2=${sp2 ?? sp1 ?? lat0} +lat_0=${lat0} +lon_0=${lon0} ${tail}` };
    case 15: { // CT_PolarStereographic: the latitude of origin key holds the standard parallel (variant B) or ±90 with a scale (variant A)
      const south = lat0 < 0;
      const poleLon = first(keys, 'ProjStraightVertPoleLongGeoKey', 'ProjNatOriginLongGeoKey') ?? 0;
      const ts = Math.abs(lat0) === 90 ? `+k=${k}` : `+lat_ts=${lat0}`;
      return { name: 'polar stereographic', proj4: `+proj=stere +lat_0=${south ? -90 : 90} ${ts} +lon_0=${poleLon} ${tail}` };
    }
    case 17: // CT_Equirectangular
      return { name: 'equirectangular', proj4: `+proj=eqc +lat_ts=${sp1 ?? 0} +lat_0=${lat0} +lon_0=${lon0} ${tail}` };
    default:
      return { unknown: `a user-defined projection with coordinate transformation ${method} (GeoTIFF CT code)` };
  }
}

export function crsFromGeoKeys(keys: GeoKeys): CrsResult {
  const code = num(keys, 'ProjectedCSTypeGeoKey');
  if (code === undefined || code === USER_DEFINED) return userDefined(keys);
  const known = EPSG_PROJECTED[code] ?? utm(code);
  if (!known) return { unknown: `EPSG:${code}` };
  return { name: `EPSG:${code} (${known[0]})`, proj4: known[1] };
}

/** The geographic (longitude, latitude) definition on the same ellipsoid as `proj4def`, so no datum step is taken. */
export function lonLatOnSameEllipsoid(proj4def: string): string {
  const parts = proj4def.split(/\s+/).filter((p) => /^\+(datum|ellps|a|b|rf|R)=/.test(p));
  return `+proj=longlat ${parts.join(' ')}`;
}
