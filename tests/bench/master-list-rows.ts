/**
 * An invented master list of `rows` characteristics for benchmarks: a site per 1 000 rows, processes of 20
 * characteristics, limits with decimal points, contexts named by id and by label.
 */
export function masterListText(rows: number): string {
  const lines = [
    'site,time zone,region,process,owner,context,monthly volume,cost per defective,currency,characteristic,unit,data kind,lsl,target,usl,risk class'
  ];
  for (let i = 0; i < rows; i++) {
    const site = `Bench Site ${Math.floor(i / 1000) + 1}`;
    const p = Math.floor(i / 20);
    const process = `Process ${p + 1}`;
    const context = p % 2 === 0 ? 'vehicle-parts' : 'Medical devices';
    lines.push(
      `${site},Europe/Vienna,Centre,${process},Owner ${p % 37},${context},${1000 + p},2.5,EUR,Feature ${i},mm,measured,${(9.9 + (i % 7) / 100).toFixed(2)},10,10.2,${i % 10 === 0 ? 'key' : 'standard'}`
    );
  }
  return lines.join('\n');
}
