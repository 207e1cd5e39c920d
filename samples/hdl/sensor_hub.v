// Sensor hub: the design behind midrail's demo dumps (see samples/README.md for the scenario
// and the delay of every gate). Every delay is written min:typ:max; `iverilog -T min|typ|max`
// picks the corner. Delays with two values are (rise, fall) as IEEE 1364-2005 7.14 defines them.
`timescale 1ns/1ps

// D flip-flop with asynchronous active-low reset; clock-to-q 0.15 ns typical.
module hub_dff #(parameter W = 1) (
  input  wire         clk,
  input  wire         rst_n,
  input  wire [W-1:0] d,
  output reg  [W-1:0] q
);
  always @(posedge clk or negedge rst_n)
    if (!rst_n) q <= #(0.10:0.13:0.17) {W{1'b0}};
    else        q <= #(0.12:0.15:0.20) d;
endmodule

// One reference clock fanned out to four leaf clocks through buffers of unequal delay.
module clock_tree (
  input  wire clk_ref,
  output wire clk_adc,
  output wire clk_spi,
  output wire clk_irq,
  output wire clk_log
);
  wire clk_irq_mid, clk_log_n;
  buf #(0.34:0.42:0.55)                 b_adc  (clk_adc, clk_ref);
  buf #(0.61:0.75:0.98)                 b_spi  (clk_spi, clk_ref);
  buf #(0.27:0.33:0.43, 0.31:0.38:0.49) b_irq1 (clk_irq_mid, clk_ref);
  buf #(0.27:0.33:0.43, 0.31:0.38:0.49) b_irq2 (clk_irq, clk_irq_mid);
  not #(0.18:0.22:0.29, 0.15:0.19:0.25) i_log1 (clk_log_n, clk_ref);
  not #(0.21:0.26:0.34, 0.14:0.17:0.22) i_log2 (clk_log, clk_log_n);
endmodule

// Chip selects (active low) for three SPI peripherals: ADC at address 1, EEPROM at 2, and the
// flash window a2·~a0 + a1·a0 (addresses 4, 6, 3, 7). That sum of products has a static-1
// hazard: with a2 = a1 = 1, a fall of a0 drops the a1·a0 term before the slow inverter lets
// a2·~a0 rise, so cs_flash_n pulses high although the flash stays selected.
module cs_decoder (
  input  wire [2:0] addr,
  input  wire       cs_en,
  output wire       cs_adc_n,
  output wire       cs_eeprom_n,
  output wire       cs_flash_n
);
  wire a0_n, a1_n, a2_n, p_lo, p_hi, flash_sel;
  not  #(0.48:0.60:0.78, 0.40:0.50:0.65) inv_a0 (a0_n, addr[0]);
  not  #(0.12:0.15:0.20, 0.10:0.12:0.16) inv_a1 (a1_n, addr[1]);
  not  #(0.12:0.15:0.20, 0.10:0.12:0.16) inv_a2 (a2_n, addr[2]);
  and  #(0.20:0.25:0.33, 0.16:0.20:0.26) and_lo (p_lo, addr[2], a0_n);
  and  #(0.20:0.25:0.33, 0.16:0.20:0.26) and_hi (p_hi, addr[1], addr[0]);
  or   #(0.24:0.30:0.39, 0.28:0.35:0.46) or_flash (flash_sel, p_lo, p_hi);
  nand #(0.20:0.25:0.33, 0.18:0.22:0.29) nand_flash (cs_flash_n, flash_sel, cs_en);
  nand #(0.26:0.32:0.42, 0.22:0.27:0.35) nand_adc (cs_adc_n, a2_n, a1_n, addr[0], cs_en);
  nand #(0.26:0.32:0.42, 0.22:0.27:0.35) nand_eep (cs_eeprom_n, a2_n, addr[1], a0_n, cs_en);
endmodule

// SPI controller: takes an address and a byte when `req` is high and it is idle or on the last
// bit of a transfer (so transfers can run back to back with busy held high), acknowledges with a
// one-cycle `ack`, then shifts the byte out MSB first, one bit per clk_spi cycle, on a gated
// serial clock.
module spi_ctrl (
  input  wire       clk_spi,
  input  wire       rst_n,
  input  wire       req,
  input  wire [2:0] req_addr,
  input  wire [7:0] req_data,
  output reg  [2:0] addr,
  output reg        busy,
  output reg        done,
  output reg        ack,
  output wire       sclk,
  output wire       mosi
);
  reg [7:0] shift;
  reg [2:0] bit_cnt;
  wire take = req && (!busy || bit_cnt == 3'd0);
  and #(0.22:0.28:0.36, 0.19:0.24:0.31) g_sclk (sclk, clk_spi, busy);
  assign mosi = shift[7];
  always @(posedge clk_spi or negedge rst_n)
    if (!rst_n) begin
      addr    <= #(0.10:0.13:0.17) 3'b000;
      busy    <= #(0.10:0.13:0.17) 1'b0;
      done    <= #(0.10:0.13:0.17) 1'b0;
      ack     <= #(0.10:0.13:0.17) 1'b0;
      shift   <= #(0.10:0.13:0.17) 8'h00;
      bit_cnt <= #(0.10:0.13:0.17) 3'd0;
    end else begin
      ack  <= #(0.12:0.15:0.20) take;
      done <= #(0.12:0.15:0.20) busy && bit_cnt == 3'd0;
      if (take) begin
        addr    <= #(0.12:0.15:0.20) req_addr;
        shift   <= #(0.12:0.15:0.20) req_data;
        bit_cnt <= #(0.12:0.15:0.20) 3'd7;
        busy    <= #(0.12:0.15:0.20) 1'b1;
      end else if (busy) begin
        shift   <= #(0.12:0.15:0.20) {shift[6:0], 1'b0};
        bit_cnt <= #(0.12:0.15:0.20) bit_cnt - 3'd1;
        if (bit_cnt == 3'd0) busy <= #(0.12:0.15:0.20) 1'b0;
      end
    end
endmodule

// 12-bit ADC model: a new conversion every fourth clk_adc cycle. The code follows two sines and
// a little LFSR noise; the registered sample drives a shared tri-state bus whose bit i switches
// 15 ps later than bit i-1 (unequal routing), and floats (z) while bus_oe is low.
module adc_frontend (
  input  wire        clk_adc,
  input  wire        rst_n,
  output wire [11:0] sample_q,
  output wire [11:0] sample_bus,
  output wire        adc_ready,
  output reg         bus_oe
);
  reg  [1:0]  phase;
  reg  [11:0] raw;
  reg  [7:0]  lfsr;
  reg         convert;
  integer     samples_taken;
  real        analog;

  hub_dff #(12) r_sample (.clk(clk_adc), .rst_n(rst_n), .d(raw), .q(sample_q));
  hub_dff #(1)  r_ready  (.clk(clk_adc), .rst_n(rst_n), .d(convert), .q(adc_ready));

  genvar i;
  generate
    for (i = 0; i < 12; i = i + 1) begin : drv
      bufif1 #((0.33 + 0.012*i):(0.40 + 0.015*i):(0.52 + 0.020*i),
               (0.33 + 0.012*i):(0.40 + 0.015*i):(0.52 + 0.020*i),
               0.24:0.30:0.39) g (sample_bus[i], sample_q[i], bus_oe);
    end
  endgenerate

  always @(posedge clk_adc or negedge rst_n)
    if (!rst_n) begin
      phase <= 2'd0;
      lfsr <= 8'h5a;
      convert <= 1'b0;
      raw <= 12'd0;
      bus_oe <= 1'b0;
      samples_taken = 0;
    end else begin
      phase <= #(0.12:0.15:0.20) phase + 2'd1;
      convert <= #(0.12:0.15:0.20) (phase == 2'd3);
      bus_oe <= #(0.12:0.15:0.20) (phase != 2'd1);
      if (phase == 2'd3) begin
        lfsr <= {lfsr[6:0], lfsr[7] ^ lfsr[5] ^ lfsr[4] ^ lfsr[3]};
        analog = 2048.0 + 1400.0 * $sin(6.283185307179586 * $realtime / 1200.0)
               + 300.0 * $sin(6.283185307179586 * $realtime / 170.0);
        raw <= $rtoi(analog) + lfsr[2:0] - 4;
        samples_taken = samples_taken + 1;
      end
    end
endmodule

// First-order RC low-pass (R = 1 kOhm, C = 15 pF typical, tau = R*C) between a PWM pin and a
// comparator. The node voltage is the exact step response v(t) = vin + (v0 - vin)*exp(-(t-t0)/tau),
// written every 0.25 ns while it moves by more than 1 mV, then snapped to the rail.
module rc_filter (
  input  wire drive,
  output reg  level_hi
);
  parameter real VDD = 3.3;
  parameter real TAU_NS = (12.0:15.0:19.5);
  parameter real STEP_NS = 0.25;
  real vin, vout, v_start, t_start;

  function real node_at(input real t);
    node_at = vin + (v_start - vin) * $exp(-(t - t_start) / TAU_NS);
  endfunction

  initial begin
    vin = 0.0; v_start = 0.0; t_start = 0.0; vout = 0.0; level_hi = 1'b0;
  end

  always @(drive) begin
    v_start = node_at($realtime);
    t_start = $realtime;
    vin = (drive === 1'b1) ? VDD : 0.0;
  end

  always begin
    #(STEP_NS);
    if (vout != vin) begin
      vout = node_at($realtime);
      if ((vout - vin < 0.001) && (vin - vout < 0.001)) vout = vin;
    end
    level_hi = (vout >= VDD / 2.0);
  end
endmodule

// Interrupt request: unequal rise/fall delays on every gate.
module irq_logic (
  input  wire clk_irq,
  input  wire rst_n,
  input  wire adc_ready,
  input  wire adc_irq_en,
  input  wire spi_done,
  input  wire level_hi,
  output wire irq_n,
  output wire irq_q
);
  wire adc_irq, irq_any;
  and #(0.72:0.90:1.17, 0.28:0.35:0.46) g_mask (adc_irq, adc_ready, adc_irq_en);
  or  #(0.40:0.50:0.65, 0.56:0.70:0.91) g_any  (irq_any, adc_irq, spi_done, level_hi);
  not #(0.20:0.25:0.33, 0.44:0.55:0.72) g_out  (irq_n, irq_any);
  hub_dff #(1) r_irq (.clk(clk_irq), .rst_n(rst_n), .d(irq_any), .q(irq_q));
endmodule

// Event log: counts clk_log cycles with a pending interrupt from 0xC0 after reset; fires
// `wrapped` when the count overflows.
module event_log (
  input  wire       clk_log,
  input  wire       rst_n,
  input  wire       irq_q,
  output reg  [7:0] irq_count
);
  event wrapped;
  always @(posedge clk_log or negedge rst_n)
    if (!rst_n) irq_count <= 8'hc0;
    else if (irq_q) begin
      irq_count <= #(0.12:0.15:0.20) irq_count + 8'd1;
      if (irq_count == 8'hff) -> wrapped;
    end
endmodule

module sensor_hub (
  input  wire       clk_ref,
  input  wire       rst_n,
  input  wire       req,
  input  wire [2:0] req_addr,
  input  wire [7:0] req_data,
  input  wire       adc_irq_en,
  input  wire       sensor_pwm,
  output wire       spi_ack,
  output wire       irq_n
);
  wire clk_adc, clk_spi, clk_irq, clk_log;
  wire [2:0] spi_addr;
  wire spi_busy, spi_done, sclk, mosi;
  wire cs_adc_n, cs_eeprom_n, cs_flash_n;
  wire [11:0] sample_q, sample_bus;
  wire adc_ready, bus_oe, level_hi, irq_q;
  wire [7:0] irq_count;

  clock_tree   u_clk (.clk_ref(clk_ref), .clk_adc(clk_adc), .clk_spi(clk_spi), .clk_irq(clk_irq), .clk_log(clk_log));
  spi_ctrl     u_spi (.clk_spi(clk_spi), .rst_n(rst_n), .req(req), .req_addr(req_addr), .req_data(req_data),
                      .addr(spi_addr), .busy(spi_busy), .done(spi_done), .ack(spi_ack), .sclk(sclk), .mosi(mosi));
  cs_decoder   u_dec (.addr(spi_addr), .cs_en(spi_busy), .cs_adc_n(cs_adc_n), .cs_eeprom_n(cs_eeprom_n),
                      .cs_flash_n(cs_flash_n));
  adc_frontend u_adc (.clk_adc(clk_adc), .rst_n(rst_n), .sample_q(sample_q), .sample_bus(sample_bus),
                      .adc_ready(adc_ready), .bus_oe(bus_oe));
  rc_filter    u_afe (.drive(sensor_pwm), .level_hi(level_hi));
  irq_logic    u_irq (.clk_irq(clk_irq), .rst_n(rst_n), .adc_ready(adc_ready), .adc_irq_en(adc_irq_en),
                      .spi_done(spi_done), .level_hi(level_hi), .irq_n(irq_n), .irq_q(irq_q));
  event_log    u_log (.clk_log(clk_log), .rst_n(rst_n), .irq_q(irq_q), .irq_count(irq_count));
endmodule
