import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { openDatabase } from "../server/db/data-source";
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "pbm-"));
const ds = await openDatabase(path.join(dir, "x.sqlite"));
const db = (ds.driver as any).databaseConnection;
db.exec(`INSERT INTO users (email,name,passwordHash,active,calendarToken,createdAt,updatedAt) VALUES ('a@x','A','x',1,'t','n','n')`);
db.exec(`INSERT INTO accounts (code,name,kind,customerClass,active,createdAt) VALUES ('B','b','internal','internal',1,'n')`);
const ids:number[]=[];
for (let i=0;i<20;i++) ids.push(Number(db.prepare(`INSERT INTO instruments (name,kind,bookableHours,labelToken,createdAt) VALUES (?,?,?,?,?)`).run("i"+i,"potentiostat","{}","tok"+i,"n").lastInsertRowid));
const book = db.prepare(`INSERT INTO bookings (userId, accountId, purpose, status, startsAt, endsAt, startMs, endMs, lateCancel, createdAt, updatedAt) VALUES (1,1,'','completed',?,?,?,?,0,'n','n')`);
const link = db.prepare(`INSERT INTO booking_instruments (bookingId, instrumentId) VALUES (?, ?)`);
const DAY=86400000; const end=Date.UTC(2026,0,1); const start=end-5*365*DAY;
db.transaction(()=>{for(let d=start;d<end;d+=DAY) for(let i=0;i<20;i++) for(const h of [9,13]){const s=d+h*3600000; const r=book.run(new Date(s).toISOString(),new Date(s+3*3600000).toISOString(),s,s+3*3600000); link.run(r.lastInsertRowid, ids[i]);}})();
db.exec("ANALYZE");
const from = Date.UTC(2024,2,1), to = Date.UTC(2024,2,8);
const variants: Record<string,string> = {
 exists: `SELECT b.* FROM bookings b WHERE b.startMs < ? AND b.endMs > ? AND b.startMs > ? AND EXISTS (SELECT 1 FROM booking_instruments bi WHERE bi.bookingId = b.id AND bi.instrumentId = ?) ORDER BY b.startMs ASC LIMIT ? OFFSET ?`,
 cross: `SELECT b.* FROM bookings b CROSS JOIN booking_instruments bi ON bi.bookingId = b.id AND bi.instrumentId = ? WHERE b.startMs < ? AND b.endMs > ? AND b.startMs > ? ORDER BY b.startMs ASC LIMIT ? OFFSET ?`,
 inlist: `SELECT b.* FROM bookings b WHERE b.startMs < ? AND b.endMs > ? AND b.startMs > ? AND b.id IN (SELECT bookingId FROM booking_instruments WHERE instrumentId = ?) ORDER BY b.startMs ASC LIMIT ? OFFSET ?`,
};
for (const [k,sql] of Object.entries(variants)) {
  const st = db.prepare(sql);
  const args = k==="cross" ? [ids[0], to, from, from-7*DAY, 500, 0] : [to, from, from-7*DAY, ids[0], 500, 0];
  let n=0; for (let i=0;i<200;i++) n=st.all(...args).length;
  const t=performance.now(); for (let i=0;i<3000;i++) st.all(...args);
  console.log(k, n, ((performance.now()-t)/3000*1000).toFixed(0),"µs", db.prepare("EXPLAIN QUERY PLAN "+sql).all(...args.map(()=>1)).map((r:any)=>r.detail).join(" | "));
}
await ds.destroy(); fs.rmSync(dir,{recursive:true});
