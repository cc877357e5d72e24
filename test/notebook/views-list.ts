// Every view built from the hand-made gallery inputs (test/views/gallery.ts).
import { allViews } from '../views/gallery';
import {
  dendrogramView,
  heatmapView,
  kEvidenceView,
  profileCardsView,
  projectionView,
  screeView,
  silhouetteView,
  View,
} from '../../src/views';

export function allViewsList(hostile: boolean): View[] {
  const v = allViews(hostile);
  return [
    dendrogramView(v.tree, { k: 3 }),
    projectionView(v.projection, v.assignment, { ids: v.ids, loadings: true, hover: { trips: v.rows.map((r) => r[0]) } }),
    screeView(v.projection),
    kEvidenceView(v.comparison),
    silhouetteView(v.sil, v.assignment, { ids: v.ids }),
    heatmapView(v.dissimilarity, { order: v.tree, assignment: v.assignment }),
    profileCardsView(v.profiles),
  ];
}
