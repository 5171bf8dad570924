/** A complex number for the test oracle; immutable, allocation-happy, clarity over speed. */
export class Complex {
  constructor(
    readonly re: number,
    readonly im: number = 0,
  ) {}

  static readonly ZERO = new Complex(0, 0);
  static readonly ONE = new Complex(1, 0);
  static readonly I = new Complex(0, 1);

  add(o: Complex): Complex {
    return new Complex(this.re + o.re, this.im + o.im);
  }
  sub(o: Complex): Complex {
    return new Complex(this.re - o.re, this.im - o.im);
  }
  mul(o: Complex): Complex {
    return new Complex(this.re * o.re - this.im * o.im, this.re * o.im + this.im * o.re);
  }
  scale(k: number): Complex {
    return new Complex(this.re * k, this.im * k);
  }
  conj(): Complex {
    return new Complex(this.re, -this.im);
  }
  abs2(): number {
    return this.re * this.re + this.im * this.im;
  }
  abs(): number {
    return Math.hypot(this.re, this.im);
  }
}
