// The look shared by every view: one small stylesheet scoped to .kinsort-view, so a notebook's
// own styles are not touched.
import { INK } from './palette';

export const VIEW_CSS = `
.kinsort-view{font-family:system-ui,-apple-system,'Segoe UI',Roboto,sans-serif;color:${INK.text};margin:12px 0 18px;padding:14px 16px 12px;border:1px solid ${INK.grid};border-radius:10px;background:${INK.paper};max-width:980px;box-sizing:border-box}
.kinsort-view .ks-head h3{margin:0 0 4px;font-size:16px;font-weight:650;letter-spacing:.01em}
.kinsort-view .ks-head p{margin:0 0 10px;font-size:13px;color:${INK.muted};line-height:1.4}
.kinsort-view .ks-live{width:100%;min-height:360px}
.kinsort-view .ks-notes{font-size:12.5px;color:${INK.text};margin:8px 0 0;padding-left:18px}
.kinsort-view .ks-notes li{margin:2px 0}
.kinsort-view table.ks-table{border-collapse:collapse;font-size:12.5px;margin-top:8px}
.kinsort-view table.ks-table th,.kinsort-view table.ks-table td{padding:3px 10px;border-bottom:1px solid ${INK.grid};text-align:right}
.kinsort-view table.ks-table th:first-child,.kinsort-view table.ks-table td:first-child{text-align:left}
.kinsort-view .ks-swatch{display:inline-flex;align-items:center;justify-content:center;min-width:26px;height:22px;padding:0 6px;border-radius:6px;font-weight:700;font-size:13px;box-sizing:border-box}
.kinsort-view .ks-cards{display:grid;grid-template-columns:repeat(auto-fill,minmax(330px,1fr));gap:12px}
.kinsort-view .ks-card{border:1px solid ${INK.grid};border-radius:9px;padding:10px 12px;background:${INK.paper};border-top-width:5px}
.kinsort-view .ks-card header{display:flex;gap:8px;align-items:center;margin-bottom:4px}
.kinsort-view .ks-card h4{margin:0;font-size:14.5px;font-weight:650;overflow-wrap:anywhere}
.kinsort-view .ks-card{overflow-wrap:anywhere}
.kinsort-view .ks-card .ks-size{font-size:12.5px;color:${INK.muted};margin:0 0 6px}
.kinsort-view .ks-card .ks-text{font-size:13px;margin:4px 0 8px;line-height:1.4}
.kinsort-view .ks-card h5{margin:8px 0 3px;font-size:11.5px;text-transform:uppercase;letter-spacing:.06em;color:${INK.muted};font-weight:600}
.kinsort-view .ks-card ul{margin:0;padding-left:16px;font-size:12.5px}
.kinsort-view .ks-card .ks-fact{font-size:12.5px;margin:2px 0}
.kinsort-view .ks-sub{margin:12px 0 4px;font-size:12px;text-transform:uppercase;letter-spacing:.06em;color:${INK.muted};font-weight:600;display:flex;gap:6px;align-items:center;flex-wrap:wrap}
.kinsort-view .ks-fact{font-size:12.5px;margin:3px 0}
.kinsort-view .ks-apart-key{font-size:11.5px;color:${INK.muted};margin:0 0 4px;line-height:1.35}
.kinsort-view .ks-apart-row{display:grid;grid-template-columns:1fr 150px;gap:6px;align-items:center;padding:3px 0;border-bottom:1px solid ${INK.grid}}
.kinsort-view .ks-apart-name{font-size:12.5px;font-weight:600;overflow-wrap:break-word}
.kinsort-view .ks-apart-values{font-size:12px;color:${INK.muted};overflow-wrap:normal}
.kinsort-view .ks-apart-bar svg{display:block}
.kinsort-view .ks-caution{font-size:11.5px;color:${INK.muted};margin-top:10px;font-style:italic}
`;
