// Stimulus for the sensor hub demo: a 50 MHz reference clock, reset, SPI traffic that walks the
// chip-select decoder through its hazard, a PWM pattern into the RC filter, and interrupt enables.
// The dump is written to sensor_hub.vcd in the working directory (samples/regenerate.sh renames it).
`timescale 1ns/1ps

module hub_bench;
  reg        clk_ref = 1'b0;
  reg        rst_n = 1'b0;
  reg        req = 1'b0;
  reg  [2:0] req_addr = 3'd0;
  reg  [7:0] req_data = 8'h00;
  reg        adc_irq_en = 1'b0;
  reg        sensor_pwm = 1'b0;
  wire       spi_ack, irq_n;
  integer    transfers = 0;

  sensor_hub dut (.clk_ref(clk_ref), .rst_n(rst_n), .req(req), .req_addr(req_addr), .req_data(req_data),
                  .adc_irq_en(adc_irq_en), .sensor_pwm(sensor_pwm), .spi_ack(spi_ack), .irq_n(irq_n));

  always #10 clk_ref = ~clk_ref;

  // One SPI transfer: present the request on a falling reference edge, hold it until the
  // controller acknowledges, and drop it on the next falling edge.
  task spi_transfer(input [2:0] addr, input [7:0] data);
    reg [2:0] last_addr;
    begin
      @(negedge clk_ref);
      req_addr = addr;
      req_data = data;
      req = 1'b1;
      @(posedge spi_ack);
      @(negedge clk_ref);
      req = 1'b0;
      last_addr = addr;
      transfers = transfers + 1;
    end
  endtask

  initial begin
    $dumpfile("sensor_hub.vcd");
    $dumpvars(0, hub_bench);
    #35 rst_n = 1'b1;
    #3000 $finish;
  end

  initial begin : spi_traffic
    #60;
    spi_transfer(3'd7, 8'ha5);   // flash window, then
    spi_transfer(3'd6, 8'h3c);   // a0 falls with a2 = a1 = 1: static hazard on cs_flash_n
    wait (!dut.spi_busy);
    #100;
    spi_transfer(3'd1, 8'h81);   // ADC
    spi_transfer(3'd2, 8'h42);   // EEPROM
    wait (!dut.spi_busy);
    #60;
    spi_transfer(3'd7, 8'hf0);
    spi_transfer(3'd6, 8'h0f);   // hazard again
    spi_transfer(3'd5, 8'h99);   // outside every window
    spi_transfer(3'd4, 8'h66);
    wait (!dut.spi_busy);
    #40;
    spi_transfer(3'd3, 8'hc3);
    spi_transfer(3'd7, 8'h18);
    spi_transfer(3'd6, 8'he7);   // hazard a third time
  end

  initial begin : irq_enable
    #200  adc_irq_en = 1'b1;
    #1300 adc_irq_en = 1'b0;
    #700  adc_irq_en = 1'b1;
  end

  // PWM into the RC filter: (high, low) times in ns. Some pulses are far shorter than tau, so the
  // filtered node never reaches half supply (a runt on the analog side).
  initial begin : pwm_pattern
    integer k;
    integer high_ns [0:9];
    integer low_ns  [0:9];
    high_ns[0] = 150; low_ns[0] = 150;
    high_ns[1] = 60;  low_ns[1] = 90;
    high_ns[2] = 8;   low_ns[2] = 120;
    high_ns[3] = 25;  low_ns[3] = 40;
    high_ns[4] = 300; low_ns[4] = 200;
    high_ns[5] = 12;  low_ns[5] = 12;
    high_ns[6] = 12;  low_ns[6] = 80;
    high_ns[7] = 100; low_ns[7] = 250;
    high_ns[8] = 40;  low_ns[8] = 20;
    high_ns[9] = 200; low_ns[9] = 300;
    #100;
    for (k = 0; k < 10; k = k + 1) begin
      sensor_pwm = 1'b1;
      #(high_ns[k]);
      sensor_pwm = 1'b0;
      #(low_ns[k]);
    end
  end
endmodule
