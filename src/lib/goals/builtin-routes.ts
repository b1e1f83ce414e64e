// Distance goals every client can pick without drawing a route. Coordinates
// are real places; the route and milestone names are Kinloop's own. Lengths
// run from about 60 km to about 1,400 km, so a rider doing around 10 km a week
// reaches a first milestone within weeks on the short routes and still has a
// year's goal on the long one. The start is not a milestone;
// the last point always is (see progressAlong). Other unmarked points only shape the line.
import type { Route } from './route';

export const BUILTIN_ROUTES: Route[] = [
  {
    id: 'sussex-shore',
    name: 'Chalk and Shingle: Brighton to Hastings',
    points: [
      { name: 'Brighton seafront', lat: 50.8195, lon: -0.1363 },
      { name: 'Rottingdean gap', lat: 50.8072, lon: -0.0577, milestone: true },
      { name: 'Newhaven harbour', lat: 50.7897, lon: 0.0566, milestone: true },
      { name: 'Seaford bay', lat: 50.7701, lon: 0.1024, milestone: true },
      { name: 'Cuckmere river mouth', lat: 50.7596, lon: 0.1543, milestone: true },
      { name: 'Birling Gap steps', lat: 50.7428, lon: 0.2007, milestone: true },
      { name: 'Beachy Head lighthouse view', lat: 50.7356, lon: 0.2414, milestone: true },
      { name: 'Eastbourne pier', lat: 50.7666, lon: 0.2903, milestone: true },
      { name: 'Pevensey Bay', lat: 50.8128, lon: 0.3453, milestone: true },
      { name: 'Bexhill promenade', lat: 50.8366, lon: 0.4722, milestone: true },
      { name: 'Hastings old town', lat: 50.8555, lon: 0.5895, milestone: true },
    ],
  },
  {
    id: 'lake-loop',
    name: 'Three Countries Lake Loop',
    points: [
      { name: 'Konstanz harbour', lat: 47.6594, lon: 9.1781 },
      { name: 'Kreuzlingen', lat: 47.6505, lon: 9.1752 },
      { name: 'Romanshorn ferry pier', lat: 47.5658, lon: 9.3788, milestone: true },
      { name: 'Arbon old town', lat: 47.5159, lon: 9.4365 },
      { name: 'Rorschach shore', lat: 47.4791, lon: 9.4922, milestone: true },
      { name: 'Bregenz lakeside', lat: 47.5050, lon: 9.7406, milestone: true },
      { name: 'Lindau island', lat: 47.5444, lon: 9.6843, milestone: true },
      { name: 'Langenargen', lat: 47.5990, lon: 9.5418 },
      { name: 'Friedrichshafen quay', lat: 47.6536, lon: 9.4768, milestone: true },
      { name: 'Meersburg castle', lat: 47.6934, lon: 9.2710, milestone: true },
      { name: 'Überlingen', lat: 47.7667, lon: 9.1586, milestone: true },
      { name: 'Bodman', lat: 47.8028, lon: 9.0258 },
      { name: 'Radolfzell', lat: 47.7369, lon: 8.9700, milestone: true },
      { name: 'Back at Konstanz harbour', lat: 47.6594, lon: 9.1781, milestone: true },
    ],
  },
  {
    id: 'danube-valley',
    name: 'Down the Danube: Passau to Vienna',
    points: [
      { name: 'Passau, where three rivers meet', lat: 48.5744, lon: 13.4663 },
      { name: 'Engelhartszell', lat: 48.5094, lon: 13.7269 },
      { name: 'Schlögen river bend', lat: 48.4270, lon: 13.8720, milestone: true },
      { name: 'Aschach', lat: 48.3740, lon: 14.0160 },
      { name: 'Linz riverside', lat: 48.3064, lon: 14.2861, milestone: true },
      { name: 'Mauthausen', lat: 48.2389, lon: 14.5208 },
      { name: 'Grein', lat: 48.2260, lon: 14.8560, milestone: true },
      { name: 'Ybbs', lat: 48.1770, lon: 15.0860 },
      { name: 'Melk abbey', lat: 48.2277, lon: 15.3324, milestone: true },
      { name: 'Spitz', lat: 48.3660, lon: 15.4160 },
      { name: 'Dürnstein', lat: 48.3955, lon: 15.5197, milestone: true },
      { name: 'Krems', lat: 48.4098, lon: 15.6102, milestone: true },
      { name: 'Tulln', lat: 48.3319, lon: 16.0589, milestone: true },
      { name: 'Vienna, Danube island', lat: 48.2300, lon: 16.4100, milestone: true },
    ],
  },
  {
    id: 'long-white-cloud',
    name: 'Aotearoa South: Auckland to Bluff',
    points: [
      { name: 'Auckland harbour bridge', lat: -36.8313, lon: 174.7462 },
      { name: 'Hamilton by the river', lat: -37.7870, lon: 175.2793, milestone: true },
      { name: 'Lake Taupō shore', lat: -38.6857, lon: 176.0702, milestone: true },
      { name: 'Palmerston North square', lat: -40.3523, lon: 175.6082, milestone: true },
      { name: 'Wellington waterfront', lat: -41.2865, lon: 174.7762, milestone: true },
      { name: 'Picton ferry terminal', lat: -41.2906, lon: 174.0010, milestone: true },
      { name: 'Kaikōura coast', lat: -42.4008, lon: 173.6814, milestone: true },
      { name: 'Christchurch', lat: -43.5321, lon: 172.6362, milestone: true },
      { name: 'Timaru', lat: -44.3970, lon: 171.2550, milestone: true },
      { name: 'Dunedin', lat: -45.8788, lon: 170.5028, milestone: true },
      { name: 'Invercargill', lat: -46.4132, lon: 168.3538 },
      { name: 'Bluff signpost', lat: -46.6145, lon: 168.3610, milestone: true },
    ],
  },
];

export function builtinRoute(id: string): Route | undefined {
  return BUILTIN_ROUTES.find((r) => r.id === id);
}
