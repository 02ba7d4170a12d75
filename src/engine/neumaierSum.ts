/** Running compensated sum (Neumaier 1974, ZAMM 54, 39: improved Kahan-Babuska summation). */
export class NeumaierSum {
  private sum = 0;
  private compensation = 0;

  add(x: number): void {
    const t = this.sum + x;
    if (Math.abs(this.sum) >= Math.abs(x)) this.compensation += this.sum - t + x;
    else this.compensation += x - t + this.sum;
    this.sum = t;
  }

  get value(): number {
    return this.sum + this.compensation;
  }
}
